"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { parseNumberText } from "@/lib/calc/number-text";
import { formatMoney } from "@/lib/catalog/money";

type Action = (prev: ActionState, payload: never) => Promise<ActionState>;

/** A part line of the job as the form starts from it. */
export interface FitLine {
  partId: string;
  /** "Brand Name" as quoted. */
  description: string;
  sku: string | null;
  /** Units in for this job: what the box starts with. */
  start: number;
}

/** What the part search answers (GET /api/v1/parts), as far as the form needs it. */
interface CatalogPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  priceMinor: number;
  stock: number;
  reserved: number;
}

interface Row {
  key: string;
  partId: string;
  label: string;
  qty: string;
  /** The quoted part this row's part is fitted instead of (a swap), else null. */
  insteadOf: string | null;
  /** The quoted line's own part, to undo a swap; null for a part added here. */
  quoted: { partId: string; label: string } | null;
}

const lineLabel = (description: string, sku: string | null) =>
  sku ? `${sku} — ${description}` : description;

/**
 * "Fitted": the parts actually fitted and the labour used. Each quoted part may be swapped for
 * another from the catalog (searched as a quote line's part is), a part not on the quote may be
 * added, and the labour starts at the quoted hours, fractions kept. Whole units per part; the
 * answer's field errors are shown on the row they name; a confirmation is asked first.
 */
export function FitForm({
  action,
  id,
  version,
  lines,
  labourHours,
  currency,
}: {
  action: Action;
  id: string;
  version: number;
  lines: FitLine[];
  /** The quoted hours as typed text ("1.5"); null when the quote sold no labour. */
  labourHours: string | null;
  currency: string;
}) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [rows, setRows] = useState<Row[]>(() =>
    lines.map((l, i) => {
      const label = lineLabel(l.description, l.sku);
      return {
        key: `q${i}`,
        partId: l.partId,
        label,
        qty: String(l.start),
        insteadOf: null,
        quoted: { partId: l.partId, label },
      };
    }),
  );
  const [swapping, setSwapping] = useState<string | null>(null);
  const [hours, setHours] = useState(labourHours ?? "0");
  const [state, setState] = useState<ActionState>(initialActionState);
  const [local, setLocal] = useState<Record<string, string>>({});
  const [sent, setSent] = useState<string[]>([]);
  const [added, setAdded] = useState(0);

  const money = (m: number) => formatMoney(m, currency);
  const partOption = (p: CatalogPart) => ({
    id: p.id,
    label: `${p.sku} — ${p.brand} ${p.name}`,
    detail: `${money(p.priceMinor)} · ${Math.max(0, p.stock - p.reserved)} free`,
    value: p,
  });
  const search = (q: string) =>
    `/api/v1/parts?${new URLSearchParams({ q, sort: "name", limit: "8" })}`;
  const set = (key: string, change: Partial<Row>) =>
    setRows((rs) => rs.map((r) => (r.key === key ? { ...r, ...change } : r)));

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const bad: Record<string, string> = {};
    const parts: { partId: string; quantity: number }[] = [];
    const keys: string[] = [];
    for (const r of rows) {
      const n = parseNumberText(r.qty);
      if (!Number.isInteger(n) || n < 0) bad[r.key] = "A whole number, 0 or more";
      else if (n > 100_000) bad[r.key] = "At most 100,000";
      else if (n > 0) {
        parts.push({ partId: r.partId, quantity: n });
        keys.push(r.key);
      }
    }
    const h = parseNumberText(hours);
    if (labourHours !== null && !(h >= 0 && h <= 1000)) bad.labour = "Hours from 0 to 1000";
    else if (labourHours !== null && Math.abs(h * 1000 - Math.round(h * 1000)) > 1e-6)
      bad.labour = "Hours with at most three decimals";
    setLocal(bad);
    if (Object.keys(bad).length) return;
    if (!window.confirm("Mark this job fitted? Stock is issued and the build moves to fitted."))
      return;
    setSent(keys);
    const payload = {
      id,
      version,
      parts,
      labourMilli: labourHours === null ? 0 : Math.round(h * 1000),
    };
    start(async () => {
      const res = await action(initialActionState, payload as never);
      setState(res);
      if (res.ok) router.refresh();
    });
  };
  const serverError = (key: string) => {
    const i = sent.indexOf(key);
    if (i < 0) return undefined;
    return state.fieldErrors?.[`parts.${i}.quantity`] ?? state.fieldErrors?.[`parts.${i}.partId`];
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {rows.length === 0 ? (
        <p className="text-sm text-ink-600">No parts on this job. Add any part that was fitted.</p>
      ) : (
        <ul className="space-y-3">
          {rows.map((r) => (
            <li key={r.key} className="rounded-md border border-ink-200 p-3" data-testid="fit-row">
              <div className="grid gap-3 sm:grid-cols-2">
                <div className="text-sm">
                  <p className="font-medium text-ink-900">{r.label}</p>
                  {r.insteadOf ? (
                    <p className="text-ink-600">Fitted instead of {r.insteadOf}</p>
                  ) : r.quoted ? null : (
                    <p className="text-ink-600">Not on the quote: billed at its catalog price</p>
                  )}
                </div>
                <Field
                  name={`qty-${r.key}`}
                  label={`${r.label} (units fitted)`}
                  inputMode="numeric"
                  value={r.qty}
                  onChange={(e) => set(r.key, { qty: e.target.value })}
                  error={local[r.key] ?? serverError(r.key)}
                />
              </div>
              <div className="mt-2 flex flex-wrap items-end gap-3">
                {r.quoted && swapping !== r.key ? (
                  <Button type="button" variant="secondary" onClick={() => setSwapping(r.key)}>
                    {r.insteadOf ? "Swap again" : "Fitted another part instead"}
                  </Button>
                ) : null}
                {r.quoted && r.insteadOf ? (
                  <Button
                    type="button"
                    variant="secondary"
                    onClick={() =>
                      set(r.key, {
                        partId: r.quoted!.partId,
                        label: r.quoted!.label,
                        insteadOf: null,
                      })
                    }
                  >
                    Back to the quoted part
                  </Button>
                ) : null}
                {!r.quoted ? (
                  <Button
                    type="button"
                    variant="secondary"
                    onClick={() => setRows((rs) => rs.filter((x) => x.key !== r.key))}
                  >
                    Remove {r.label}
                  </Button>
                ) : null}
                {swapping === r.key ? (
                  <>
                    <SearchCombobox<{ parts: CatalogPart[] }, CatalogPart>
                      label={`Part fitted instead of ${r.quoted!.label}`}
                      placeholder="Type a SKU, name or brand"
                      url={search}
                      options={(res) => res.parts.map(partOption)}
                      empty="No part matches; try another SKU, name or brand"
                      onPick={(p) => {
                        set(r.key, {
                          partId: p.id,
                          label: `${p.sku} — ${p.brand} ${p.name}`,
                          insteadOf: p.id === r.quoted!.partId ? null : r.quoted!.label,
                        });
                        setSwapping(null);
                      }}
                    />
                    <Button type="button" variant="secondary" onClick={() => setSwapping(null)}>
                      Keep the part
                    </Button>
                  </>
                ) : null}
              </div>
            </li>
          ))}
        </ul>
      )}
      <SearchCombobox<{ parts: CatalogPart[] }, CatalogPart>
        label="Add a part that was fitted"
        placeholder="Type a SKU, name or brand"
        url={search}
        options={(res) => res.parts.map(partOption)}
        empty="No part matches; try another SKU, name or brand"
        onPick={(p) => {
          setRows((rs) => [
            ...rs,
            {
              key: `a${added}`,
              partId: p.id,
              label: `${p.sku} — ${p.brand} ${p.name}`,
              qty: "1",
              insteadOf: null,
              quoted: null,
            },
          ]);
          setAdded((n) => n + 1);
        }}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        {labourHours !== null ? (
          <Field
            name="labour-hours"
            label="Labour used (hours)"
            inputMode="decimal"
            value={hours}
            onChange={(e) => setHours(e.target.value)}
            error={local.labour ?? state.fieldErrors?.labourMilli}
          />
        ) : (
          <p className="text-sm text-ink-600">The quote sold no labour, so none is billed.</p>
        )}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} aria-busy={pending}>
          {pending ? "Saving…" : "Mark fitted"}
        </Button>
        <FormStatus ok={state.ok} message={state.ok ? "Saved" : state.message} />
      </div>
    </form>
  );
}
