"use client";

import {
  useWatch,
  type Control,
  type UseFormRegister,
  type UseFormSetValue,
} from "react-hook-form";

import { Button, LinkButton } from "@/components/ui/button";

interface Table {
  voltages: (number | undefined)[];
  pressuresKpa: (number | undefined)[];
  deadTimeMs: (number | undefined)[][];
}

const cell =
  "figure w-full rounded-md border border-ink-300 bg-white px-2 py-1 text-right aria-[invalid=true]:border-2 aria-[invalid=true]:border-danger-600";

/** The injector's dead time by battery voltage (rows) and differential pressure (columns). */
export function DeadTimeGrid({
  control,
  register,
  setValue,
  pressureUnit,
  errors,
  toNumber,
}: {
  control: Control<any>;
  register: UseFormRegister<any>;
  setValue: UseFormSetValue<any>;
  pressureUnit: string;
  /** The form's messages by field path: the table's are shown above it, their cells highlighted. */
  errors: Record<string, string>;
  toNumber: (v: unknown) => number | undefined;
}) {
  const mine = Object.entries(errors).filter(([k]) => k.startsWith("injectors.deadTime"));
  const error = mine[0]?.[1];
  const bad = (path: string) => Boolean(errors[path]);
  const t = (useWatch({ control, name: "injectors.deadTime" }) as Table | undefined) ?? {
    voltages: [],
    pressuresKpa: [],
    deadTimeMs: [],
  };
  const put = (next: Table) => setValue("injectors.deadTime", next, { shouldDirty: true });
  const addRow = () =>
    put({
      ...t,
      voltages: [...t.voltages, undefined],
      deadTimeMs: [...t.deadTimeMs, t.pressuresKpa.map(() => undefined)],
    });
  const addCol = () =>
    put({
      ...t,
      pressuresKpa: [...t.pressuresKpa, undefined],
      deadTimeMs: t.deadTimeMs.map((r) => [...r, undefined]),
    });
  const dropRow = (i: number) =>
    put({
      ...t,
      voltages: t.voltages.filter((_, k) => k !== i),
      deadTimeMs: t.deadTimeMs.filter((_, k) => k !== i),
    });
  const dropCol = (j: number) =>
    put({
      ...t,
      pressuresKpa: t.pressuresKpa.filter((_, k) => k !== j),
      deadTimeMs: t.deadTimeMs.map((r) => r.filter((_, k) => k !== j)),
    });
  const n = { setValueAs: toNumber };
  return (
    <div>
      <p className="text-sm font-medium text-ink-700">
        Dead time (ms) by voltage and pressure across the injector ({pressureUnit})
      </p>
      {error ? (
        <p role="alert" className="text-sm text-danger-700">
          ✕ {error}
        </p>
      ) : null}
      {/* A grid of inputs that grows by columns: it may scroll sideways on its own. */}
      <div className="mt-1 overflow-x-auto" data-scroll-x>
        <table className="text-sm">
          <thead>
            <tr>
              <th scope="col" className="px-1 text-left font-normal text-ink-600">
                V \ {pressureUnit}
              </th>
              {t.pressuresKpa.map((_, j) => (
                <th key={j} scope="col" className="px-1">
                  <input
                    aria-label={`Pressure column ${j + 1} (${pressureUnit})`}
                    aria-invalid={bad(`injectors.deadTime.pressuresKpa.${j}`)}
                    inputMode="decimal"
                    className={cell}
                    {...register(`injectors.deadTime.pressuresKpa.${j}`, n)}
                  />
                  <LinkButton
                    className="text-xs"
                    aria-label={`Remove pressure column ${j + 1}`}
                    onClick={() => dropCol(j)}
                    disabled={t.pressuresKpa.length < 2}
                  >
                    remove
                  </LinkButton>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {t.voltages.map((_, i) => (
              <tr key={i}>
                <th scope="row" className="px-1">
                  <input
                    aria-label={`Voltage row ${i + 1} (V)`}
                    aria-invalid={bad(`injectors.deadTime.voltages.${i}`)}
                    inputMode="decimal"
                    className={cell}
                    {...register(`injectors.deadTime.voltages.${i}`, n)}
                  />
                </th>
                {t.pressuresKpa.map((_, j) => (
                  <td key={j} className="px-1">
                    <input
                      aria-label={`Dead time at row ${i + 1}, column ${j + 1} (ms)`}
                      aria-invalid={bad(`injectors.deadTime.deadTimeMs.${i}.${j}`)}
                      inputMode="decimal"
                      className={cell}
                      {...register(`injectors.deadTime.deadTimeMs.${i}.${j}`, n)}
                    />
                  </td>
                ))}
                <td>
                  <LinkButton
                    className="text-xs"
                    aria-label={`Remove voltage row ${i + 1}`}
                    onClick={() => dropRow(i)}
                    disabled={t.voltages.length < 2}
                  >
                    remove
                  </LinkButton>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="mt-2 flex gap-2">
        <Button
          type="button"
          variant="secondary"
          onClick={addRow}
          disabled={t.voltages.length >= 20}
        >
          Add voltage
        </Button>
        <Button
          type="button"
          variant="secondary"
          onClick={addCol}
          disabled={t.pressuresKpa.length >= 20}
        >
          Add pressure
        </Button>
      </div>
    </div>
  );
}
