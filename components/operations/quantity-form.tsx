"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { parseNumberText } from "@/lib/calc/number-text";

type Action = (prev: ActionState, payload: never) => Promise<ActionState>;

export interface QuantityRow {
  key: string;
  label: string;
  /** What the box starts with (what is outstanding, what was quoted). */
  start: number;
  max?: number;
}

/**
 * A whole number per row and, for fitting, the labour hours: receiving against a purchase order
 * (`kind: "receive"`) or fitting a job (`kind: "fit"`). The answer's field errors are shown on
 * the row they name; a confirmation is asked first.
 */
export function QuantityForm({
  kind,
  action,
  id,
  version,
  rows,
  labourHours,
  confirm,
  submitLabel,
}: {
  kind: "receive" | "fit";
  action: Action;
  id: string;
  version?: number;
  rows: QuantityRow[];
  labourHours?: number;
  confirm: string;
  submitLabel: string;
}) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [values, setValues] = useState(() =>
    Object.fromEntries(rows.map((r) => [r.key, String(r.start)])),
  );
  const [hours, setHours] = useState(String(labourHours ?? 0));
  const [state, setState] = useState<ActionState>(initialActionState);
  const [local, setLocal] = useState<Record<string, string>>({});

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const bad: Record<string, string> = {};
    const qty = rows.map((r) => {
      const n = parseNumberText(values[r.key] ?? "");
      if (!Number.isInteger(n) || n < 0) bad[r.key] = "A whole number, 0 or more";
      else if (r.max !== undefined && n > r.max) bad[r.key] = `At most ${r.max}`;
      return Number.isInteger(n) ? n : 0;
    });
    const h = parseNumberText(hours);
    if (kind === "fit" && !(h >= 0 && h <= 1000)) bad.labour = "Hours from 0 to 1000";
    setLocal(bad);
    if (Object.keys(bad).length) return;
    if (!window.confirm(confirm)) return;
    const payload =
      kind === "receive"
        ? {
            id,
            lines: rows
              .map((r, i) => ({ lineId: r.key, quantity: qty[i]! }))
              .filter((l) => l.quantity > 0),
          }
        : {
            id,
            version,
            parts: rows
              .map((r, i) => ({ partId: r.key, quantity: qty[i]! }))
              .filter((p) => p.quantity > 0),
            labourMilli: Math.round(h * 1000),
          };
    start(async () => {
      const res = await action(initialActionState, payload as never);
      setState(res);
      if (res.ok) router.refresh();
    });
  };
  const serverError = (i: number) =>
    state.fieldErrors?.[`lines.${i}.quantity`] ?? state.fieldErrors?.[`parts.${i}.quantity`];
  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        {rows.map((r, i) => (
          <Field
            key={r.key}
            name={`qty-${r.key}`}
            label={r.label}
            inputMode="numeric"
            value={values[r.key] ?? ""}
            onChange={(e) => setValues({ ...values, [r.key]: e.target.value })}
            error={local[r.key] ?? serverError(i)}
          />
        ))}
        {kind === "fit" ? (
          <Field
            name="labour-hours"
            label="Labour used (hours)"
            inputMode="decimal"
            value={hours}
            onChange={(e) => setHours(e.target.value)}
            error={local.labour ?? state.fieldErrors?.labourMilli}
          />
        ) : null}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} aria-busy={pending}>
          {pending ? "Saving…" : submitLabel}
        </Button>
        <FormStatus ok={state.ok} message={state.ok ? "Saved" : state.message} />
      </div>
    </form>
  );
}
