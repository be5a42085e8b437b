"use client";

import { useFieldArray, type Control } from "react-hook-form";

import { Button } from "@/components/ui/button";

/** Renders one number field of the form (label and unit from the registry, or the given label). */
type NumField = (name: string, label?: string) => React.ReactNode;

/**
 * Every flow curve of one pump (a curve per test voltage: the sizing reads the pump at the
 * voltage it gets from between them), each with its points; curves and points added and
 * removed. The first curve's fields keep their short labels; a later curve's name the curve.
 */
export function PumpCurves({
  pump,
  control,
  num,
  errors,
}: {
  pump: number;
  control: Control<any>;
  num: NumField;
  errors: Record<string, string>;
}) {
  const curves = useFieldArray({ control, name: `pumps.${pump}.curves` });
  const whose = pump === 0 ? "" : "second pump's ";
  return (
    <div className="space-y-3 sm:col-span-2" data-testid={`pump-${pump}-curves`}>
      {errors[`pumps.${pump}.curves`] ? (
        <p role="alert" className="text-sm text-danger-700">
          ✕ {errors[`pumps.${pump}.curves`]}
        </p>
      ) : null}
      {curves.fields.map((c, ci) => (
        <CurvePoints
          key={c.id}
          pump={pump}
          curve={ci}
          control={control}
          num={num}
          errors={errors}
          onRemove={curves.fields.length > 1 ? () => curves.remove(ci) : undefined}
        />
      ))}
      {curves.fields.length < 8 ? (
        <Button
          type="button"
          variant="secondary"
          onClick={() =>
            curves.append({
              voltage: undefined,
              points: [
                { pressureKpa: undefined, flowLPerH: undefined },
                { pressureKpa: undefined, flowLPerH: undefined },
              ],
            })
          }
        >
          {`Add a ${whose}curve at another voltage`}
        </Button>
      ) : null}
    </div>
  );
}

function CurvePoints({
  pump,
  curve,
  control,
  num,
  errors,
  onRemove,
}: {
  pump: number;
  curve: number;
  control: Control<any>;
  num: NumField;
  errors: Record<string, string>;
  onRemove?: () => void;
}) {
  const base = `pumps.${pump}.curves.${curve}`;
  const points = useFieldArray({ control, name: `${base}.points` });
  const whose = pump === 0 ? "" : "Second pump's ";
  const name = curve === 0 ? "" : `Curve ${curve + 1} `;
  const label = (s: string) => (curve === 0 ? undefined : `${name}${s}`);
  return (
    <div
      role="group"
      aria-label={`${whose}${curve === 0 ? "flow curve" : `flow curve ${curve + 1}`}`}
      className="rounded-md border border-ink-200 p-3"
    >
      <div className="grid grid-cols-[1fr_auto] items-end gap-2">
        {num(`${base}.voltage`, label("tested at"))}
        {onRemove ? (
          <Button
            type="button"
            variant="ghost"
            aria-label={`Remove curve ${curve + 1}${pump === 0 ? "" : " of the second pump"}`}
            onClick={onRemove}
          >
            Remove curve
          </Button>
        ) : null}
      </div>
      {errors[`${base}.points`] ? (
        <p role="alert" className="mt-1 text-sm text-danger-700">
          ✕ {errors[`${base}.points`]}
        </p>
      ) : null}
      <div className="mt-2 space-y-2">
        {points.fields.map((p, i) => (
          <div key={p.id} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
            {num(`${base}.points.${i}.pressureKpa`, label(`point ${i + 1} pressure`))}
            {num(`${base}.points.${i}.flowLPerH`, label(`point ${i + 1} flow`))}
            <Button
              type="button"
              variant="ghost"
              aria-label={`Remove ${whose.toLowerCase()}${curve === 0 ? "" : `curve ${curve + 1} `}point ${i + 1}`}
              onClick={() => points.remove(i)}
            >
              ✕
            </Button>
          </div>
        ))}
      </div>
      <Button
        type="button"
        variant="secondary"
        className="mt-2"
        onClick={() => points.append({ pressureKpa: undefined, flowLPerH: undefined })}
      >
        {pump === 0 && curve === 0
          ? "Add point"
          : `Add a point to the ${whose.toLowerCase()}${curve === 0 ? "curve" : `curve ${curve + 1}`}`}
      </Button>
    </div>
  );
}
