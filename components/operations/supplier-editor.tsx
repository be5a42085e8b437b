"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition, type InputHTMLAttributes } from "react";

import { CellInput } from "@/components/operations/cell-input";
import { Button, LinkButton } from "@/components/ui/button";
import { EditConflict } from "@/components/ui/edit-conflict";
import { Field, TextAreaField } from "@/components/ui/field";
import { useLeaveGuard } from "@/components/ui/leave-guard";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { parseNumberText } from "@/lib/calc/number-text";
import { formatMoney, minorToPlain, parseMoney } from "@/lib/catalog/money";
import { updateSupplierAction } from "@/lib/purchasing/purchasing-actions";

/** A supplier as the page loads it (db/queries/purchasing.ts#getSupplier). */
export interface EditedSupplier {
  id: string;
  version: number;
  name: string;
  contactName: string | null;
  email: string | null;
  phone: string | null;
  leadTimeDays: number | null;
  notes: string | null;
  parts: {
    partId: string;
    sku: string;
    name: string;
    supplierSku: string;
    costMinor: number | null;
  }[];
}

interface PartRow {
  partId: string;
  label: string;
  supplierSku: string;
  cost: string;
}
interface CatalogPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  costMinor: number | null;
}

/**
 * The two inputs of a part's row: its key in the row, its path in the schema (and so its id and
 * name), the column it stands in and what a screen reader calls it.
 */
const ROW_INPUTS = [
  {
    key: "supplierSku",
    path: "supplierSku",
    column: "Their SKU",
    label: (part: string) => `Their SKU for ${part}`,
    input: { maxLength: 60 },
  },
  {
    key: "cost",
    path: "costMinor",
    column: "Cost",
    label: (part: string) => `Cost of ${part}`,
    input: { className: "text-right", inputMode: "decimal" },
  },
] as const satisfies readonly {
  key: "supplierSku" | "cost";
  path: string;
  column: string;
  label: (part: string) => string;
  input: Partial<InputHTMLAttributes<HTMLInputElement>>;
}[];

const fieldsOf = (s: EditedSupplier) => ({
  name: s.name,
  contactName: s.contactName ?? "",
  email: s.email ?? "",
  phone: s.phone ?? "",
  leadTimeDays: s.leadTimeDays === null ? "" : String(s.leadTimeDays),
  notes: s.notes ?? "",
});
const rowsOf = (s: EditedSupplier): PartRow[] =>
  s.parts.map((p) => ({
    partId: p.partId,
    label: `${p.sku} — ${p.name}`,
    supplierSku: p.supplierSku,
    cost: p.costMinor === null ? "" : minorToPlain(p.costMinor),
  }));

/**
 * Edits a supplier: name, contact, where orders are e-mailed, phone, usual lead time, notes, and
 * their SKUs and costs for our parts (the whole list is saved). Each field shows its own message
 * (typed here, or the server's); a stale save shows theirs beside yours.
 */
export function SupplierEditor(props: { supplier: EditedSupplier; currency: string }) {
  // A fresh form from each saved version; "Saved" outlives that fresh start.
  const [saved, setSaved] = useState(false);
  return (
    <SupplierEditorForm key={props.supplier.version} {...props} saved={saved} setSaved={setSaved} />
  );
}

function SupplierEditorForm({
  supplier,
  currency,
  saved,
  setSaved,
}: {
  supplier: EditedSupplier;
  currency: string;
  saved: boolean;
  setSaved: (b: boolean) => void;
}) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [v, setV] = useState(() => fieldsOf(supplier));
  const [rows, setRows] = useState<PartRow[]>(() => rowsOf(supplier));
  const [state, setState] = useState<ActionState>(initialActionState);
  const [local, setLocal] = useState<Record<string, string>>({});
  const dirty =
    JSON.stringify([v, rows]) !== JSON.stringify([fieldsOf(supplier), rowsOf(supplier)]);
  useLeaveGuard(dirty && !pending);

  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => {
    setSaved(false);
    setV({ ...v, [k]: e.target.value });
  };
  const setRow = (i: number, patch: Partial<PartRow>) => {
    setSaved(false);
    setRows(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  };
  const err = (path: string) => local[path] ?? state.fieldErrors?.[path];
  /** A supplier field's id (focused when it is the first one wrong), name, value and message. */
  const field = (k: keyof typeof v) => ({
    id: `sup-${k}`,
    name: k,
    value: v[k],
    onChange: set(k),
    error: err(k),
  });

  const save = (version: number) => {
    const bad: Record<string, string> = {};
    if (!v.name.trim()) bad.name = "Name is required";
    let days: number | null = null;
    if (v.leadTimeDays.trim() !== "") {
      const n = parseNumberText(v.leadTimeDays);
      if (!Number.isInteger(n) || n < 0 || n > 3650)
        bad.leadTimeDays = "A whole number of days from 0 to 3650";
      else days = n;
    }
    const parts = rows.map((r, i) => {
      if (!r.supplierSku.trim()) bad[`parts.${i}.supplierSku`] = "Their SKU is required";
      let costMinor: number | null = null;
      if (r.cost.trim() !== "") {
        const c = parseMoney(r.cost);
        if (c === null || c < 0 || c > 100_000_000)
          bad[`parts.${i}.costMinor`] =
            `A cost such as 12.50, at most ${formatMoney(100_000_000, currency)}`;
        else costMinor = c;
      }
      return { partId: r.partId, supplierSku: r.supplierSku.trim(), costMinor };
    });
    setLocal(bad);
    const first = Object.keys(bad)[0];
    if (first) {
      document.getElementById(`sup-${first}`)?.focus();
      return;
    }
    setSaved(false);
    start(async () => {
      const res = await updateSupplierAction(initialActionState, {
        id: supplier.id,
        version,
        name: v.name,
        contactName: v.contactName,
        email: v.email.trim(),
        phone: v.phone,
        leadTimeDays: days,
        notes: v.notes,
        parts,
      });
      setState(res);
      if (res.ok) {
        setSaved(true);
        router.refresh();
      } else {
        const path = Object.keys(res.fieldErrors ?? {})[0];
        if (path) document.getElementById(`sup-${path}`)?.focus();
      }
    });
  };
  const theirs = state.status === 409 ? (state.current as EditedSupplier | undefined) : undefined;

  return (
    <form
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        save(supplier.version);
      }}
      className="space-y-6"
      aria-label="Supplier"
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <Field {...field("name")} label="Supplier" maxLength={120} />
        <Field {...field("contactName")} label="Contact" maxLength={200} />
        <Field {...field("email")} label="Orders e-mail" type="email" />
        <Field {...field("phone")} label="Phone" type="tel" maxLength={40} />
        <Field {...field("leadTimeDays")} label="Lead time (days)" inputMode="numeric" />
        <TextAreaField {...field("notes")} label="Notes" maxLength={2000} rows={2} />
      </div>

      <fieldset className="space-y-3">
        <legend className="text-lg font-semibold text-ink-900">Their SKUs for our parts</legend>
        {rows.length === 0 ? (
          <p className="text-sm text-ink-600">
            No parts yet: add the parts this supplier sells you, with their SKU and your cost.
          </p>
        ) : (
          <table className="table-cards w-full text-left text-sm" data-testid="supplier-parts">
            <thead className="text-ink-700">
              <tr>
                <th scope="col" className="py-1 pr-2">
                  Our part
                </th>
                <th scope="col" className="py-1 pr-2">
                  Their SKU
                </th>
                <th scope="col" className="py-1 pr-2">
                  Cost ({currency})
                </th>
                <th scope="col" className="py-1">
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r, i) => (
                <tr key={r.partId} className="border-t border-ink-100 align-top">
                  <td className="py-2 pr-2 text-ink-800">{r.label}</td>
                  {ROW_INPUTS.map((c) => (
                    <td key={c.path} className="py-2 pr-2" data-label={c.column}>
                      <CellInput
                        id={`sup-parts.${i}.${c.path}`}
                        name={`parts.${i}.${c.path}`}
                        label={c.label(r.label)}
                        {...c.input}
                        value={r[c.key]}
                        onChange={(e) => setRow(i, { [c.key]: e.target.value })}
                        error={err(`parts.${i}.${c.path}`)}
                      />
                    </td>
                  ))}
                  <td className="py-2">
                    <LinkButton
                      onClick={() => {
                        setSaved(false);
                        setRows(rows.filter((_, j) => j !== i));
                      }}
                      aria-label={`Remove ${r.label}`}
                    >
                      Remove
                    </LinkButton>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <SearchCombobox<{ parts: CatalogPart[] }, CatalogPart>
          label="Add a part they sell"
          placeholder="Type a SKU, name or brand"
          url={(q) => `/api/v1/parts?${new URLSearchParams({ q, sort: "name", limit: "8" })}`}
          options={(r) =>
            r.parts
              .filter((p) => !rows.some((x) => x.partId === p.id))
              .map((p) => ({
                id: p.id,
                label: `${p.sku} — ${p.brand} ${p.name}`,
                value: p,
              }))
          }
          empty="No other part matches; try another SKU, name or brand"
          onPick={(p) => {
            setSaved(false);
            setRows([
              ...rows,
              {
                partId: p.id,
                label: `${p.sku} — ${p.brand} ${p.name}`,
                supplierSku: "",
                cost: p.costMinor === null ? "" : minorToPlain(p.costMinor),
              },
            ]);
          }}
        />
        {err("parts") ? (
          <p role="alert" className="text-sm font-medium text-danger-700">
            ✕ {[err("parts")].flat().join(" ")}
          </p>
        ) : null}
      </fieldset>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} aria-busy={pending}>
          {pending ? "Saving…" : "Save supplier"}
        </Button>
        {theirs ? (
          <EditConflict
            what="this supplier"
            version={theirs.version}
            disabled={pending}
            onOverwrite={() => save(theirs.version)}
            rows={[
              ["Supplier", v.name, theirs.name],
              ["Contact", v.contactName, theirs.contactName ?? ""],
              ["Orders e-mail", v.email, theirs.email ?? ""],
              ["Phone", v.phone, theirs.phone ?? ""],
              [
                "Lead time (days)",
                v.leadTimeDays,
                theirs.leadTimeDays === null ? "" : String(theirs.leadTimeDays),
              ],
              ["Notes", v.notes, theirs.notes ?? ""],
            ].map(([label, yours, t]) => ({ label: label!, yours: yours!, theirs: t! }))}
          />
        ) : (
          <FormStatus
            ok={saved || undefined}
            message={
              saved
                ? "Saved"
                : Object.keys(local).length
                  ? "Check the fields marked"
                  : state.ok
                    ? undefined
                    : state.message
            }
          />
        )}
      </div>
    </form>
  );
}
