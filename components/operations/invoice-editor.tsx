"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { ActionButton } from "@/components/operations/action-button";
import { CellInput } from "@/components/operations/cell-input";
import { BalanceRow, LedgerRow } from "@/components/operations/ledger-rows";
import { Button, LinkButton } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/field";
import { useLeaveGuard } from "@/components/ui/leave-guard";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { formatMoney } from "@/lib/catalog/money";
import { editInvoiceAction, issueInvoiceAction } from "@/lib/invoices/invoice-actions";
import {
  draftLine,
  LINE_FIELDS,
  lineIssues,
  lineRowOf,
  parseLineRow,
  partLineRow,
  serverLineField,
  type EditedLine,
  type LineRow,
} from "@/lib/quotes/line-rows";
import { quoteLimitMessages, quoteSizeIssue } from "@/lib/quotes/quote-limits";
import type { PricedPart } from "@/lib/quotes/quote-lines";
import { formatDeduction, presentQuote } from "@/lib/quotes/quote-presentation";

/** A row as typed, with a key of its own (rows are added and removed). */
type Row = LineRow & { key: string };
type EditorProps = {
  id: string;
  /** Who the issued invoice is e-mailed to (named in the note beside "Issue"). */
  customerName: string;
  version: number;
  currency: string;
  taxRateBp: number;
  depositMinor: number;
  notes: string;
  lines: EditedLine[];
};

const QTY_LABEL = { part: "units", labour: "hours", fee: "quantity" } as const;

/**
 * A draft invoice before it is issued: the lines actually fitted (quantity, price, discount;
 * a line removed, a part added), the labour hours used, and the notes. Totals, the deposit and
 * the balance are worked live in integer cents exactly as the server works them; each wrong
 * field is marked with its own message. Issued invoices never show this (a credit note
 * corrects them).
 */
export function InvoiceEditor(props: EditorProps) {
  const [outcome, setOutcome] = useState<{ ok: boolean; message: string } | null>(null);
  return (
    <InvoiceEditorForm key={props.version} {...props} outcome={outcome} setOutcome={setOutcome} />
  );
}

function InvoiceEditorForm({
  outcome,
  setOutcome,
  ...props
}: EditorProps & {
  outcome: { ok: boolean; message: string } | null;
  setOutcome: (o: { ok: boolean; message: string } | null) => void;
}) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [initial] = useState(() => props.lines.map((l, i) => ({ key: `l${i}`, ...lineRowOf(l) })));
  const [added, setAdded] = useState(0);
  const [rows, setRows] = useState<Row[]>(initial);
  const [notes, setNotes] = useState(props.notes);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [state, setState] = useState<ActionState>(initialActionState);
  const limits = quoteLimitMessages(props.currency);
  const strip = (rs: Row[]) => rs.map(({ key: _key, ...r }) => r);
  const dirty =
    notes !== props.notes || JSON.stringify(strip(rows)) !== JSON.stringify(strip(initial));
  useLeaveGuard(dirty && !pending);

  const parsed = rows.map(parseLineRow);
  const local: Record<string, string> = Object.fromEntries(
    rows.flatMap((r, i) => lineIssues(r, parsed[i]!, limits).map(([f, m]) => [`${r.key}.${f}`, m])),
  );
  const errors = { ...serverErrors, ...local };
  const errorOf = (r: Row, f: string) => errors[`${r.key}.${f}`];
  const good = Object.keys(local).length === 0;
  const lines: EditedLine[] = rows.map((r, i) => ({
    ...draftLine(r, parsed[i]!),
    description: r.description.trim(),
  }));
  const shown = presentQuote({ currency: props.currency, taxRateBp: props.taxRateBp }, lines);
  const sizeIssue = good
    ? quoteSizeIssue(lines, props.currency, "The invoice's lines add up")
    : null;
  const balance = shown.minor.total - props.depositMinor;
  const money = (m: number) => formatMoney(m, props.currency);

  const change = (key: string, patch: Partial<Row>) => {
    setOutcome(null);
    setRows(rows.map((r) => (r.key === key ? { ...r, ...patch } : r)));
    setServerErrors((e) =>
      Object.fromEntries(Object.entries(e).filter(([k]) => !k.startsWith(`${key}.`))),
    );
  };

  /** A row's quantity, unit price or discount: its card label `column`, read as "Line 1: `name`". */
  const numberCell = (
    r: Row,
    i: number,
    f: "qty" | "price" | "discount",
    column: string,
    name: string,
  ) => (
    <td className="px-2 py-2" data-label={column}>
      <CellInput
        id={`inv-${r.key}-${f}`}
        label={`Line ${i + 1}: ${name}`}
        inputMode="decimal"
        className="text-right"
        value={r[f]}
        onChange={(e) => change(r.key, { [f]: e.target.value })}
        error={errorOf(r, f)}
      />
    </td>
  );

  const save = () => {
    if (!good || sizeIssue) {
      const first = rows.flatMap((r) =>
        LINE_FIELDS.filter((f) => local[`${r.key}.${f}`]).map((f) => `inv-${r.key}-${f}`),
      )[0];
      if (first) document.getElementById(first)?.focus();
      setOutcome({ ok: false, message: sizeIssue ?? "Check the fields marked" });
      return;
    }
    setOutcome(null);
    start(async () => {
      const res = await editInvoiceAction(initialActionState, {
        id: props.id,
        version: props.version,
        notes,
        lines,
      });
      setState(res);
      if (res.ok) {
        const data = res.data as { version?: number } | undefined;
        setOutcome({
          ok: true,
          message: data?.version === props.version ? "Nothing to save" : "Draft saved",
        });
        router.refresh();
        return;
      }
      // "lines.2.unitPriceMinor" → that row's price cell.
      const mapped: Record<string, string> = {};
      for (const [path, msgs] of Object.entries(res.fieldErrors ?? {})) {
        const at = serverLineField(path);
        const row = at ? rows[at.index] : undefined;
        if (row && at) mapped[`${row.key}.${at.field}`] = msgs.join(" ");
      }
      setServerErrors(mapped);
      const first = Object.keys(mapped)[0];
      if (first) document.getElementById(`inv-${first.replace(".", "-")}`)?.focus();
      setOutcome({
        ok: false,
        message:
          res.status === 409
            ? "Someone changed this draft meanwhile; reload the page to see it (your edits were not saved)"
            : (res.message ?? "Not saved"),
      });
    });
  };

  return (
    <>
      <form
        noValidate
        aria-label="Draft invoice"
        onSubmit={(e) => {
          e.preventDefault();
          save();
        }}
        className="space-y-4"
      >
        <table className="table-cards w-full text-left text-sm" data-testid="invoice-editor">
          <thead className="bg-ink-100 text-ink-700">
            <tr>
              <th scope="col" className="px-2 py-2">
                Line
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Quantity
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Unit price
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Discount %
              </th>
              <th scope="col" className="px-2 py-2 text-right">
                Line total
              </th>
              <th scope="col" className="px-2 py-2">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-2 py-3 text-ink-600">
                  No lines: add a part below, or reload to start again from the job.
                </td>
              </tr>
            ) : null}
            {rows.map((r, i) => (
              <tr key={r.key} className="border-t border-ink-100 align-top">
                <td className="card-wide px-2 py-2">
                  <CellInput
                    id={`inv-${r.key}-description`}
                    label={`Line ${i + 1}: description`}
                    value={r.description}
                    maxLength={200}
                    onChange={(e) => change(r.key, { description: e.target.value })}
                    error={errorOf(r, "description")}
                  />
                  {r.sku ? <span className="mt-1 block text-xs text-ink-600">{r.sku}</span> : null}
                </td>
                {numberCell(r, i, "qty", `Quantity (${QTY_LABEL[r.kind]})`, QTY_LABEL[r.kind])}
                {numberCell(r, i, "price", "Unit price", "unit price")}
                {numberCell(r, i, "discount", "Discount %", "discount %")}
                <td className="figure px-2 py-2 text-right" data-label="Line total">
                  {shown.lines[i]!.lineTotal}
                </td>
                <td className="px-2 py-2 text-right">
                  <LinkButton
                    aria-label={`Remove line ${i + 1}: ${r.description}`}
                    onClick={() => {
                      setOutcome(null);
                      setRows(rows.filter((x) => x.key !== r.key));
                    }}
                  >
                    Remove
                  </LinkButton>
                </td>
              </tr>
            ))}
          </tbody>
        </table>

        <SearchCombobox<{ parts: PricedPart[] }, PricedPart>
          label="Add a part that was fitted"
          placeholder="Type a SKU, name or brand"
          url={(q) => `/api/v1/parts?${new URLSearchParams({ q, sort: "name", limit: "8" })}`}
          options={(r) =>
            r.parts.map((p) => ({
              id: p.id,
              label: `${p.sku} — ${p.brand} ${p.name}`,
              detail: money(p.priceMinor),
              value: p,
            }))
          }
          empty="No part matches; try another SKU, name or brand"
          onPick={(p) => {
            setOutcome(null);
            setAdded(added + 1);
            setRows([...rows, { key: `a${added}`, ...partLineRow(p) }]);
          }}
        />

        <dl className="ml-auto max-w-sm space-y-1 text-sm" data-testid="invoice-editor-totals">
          <LedgerRow label="Subtotal">{shown.subtotal}</LedgerRow>
          <LedgerRow label={shown.taxLabel}>{shown.tax}</LedgerRow>
          <LedgerRow label="Total" className="font-semibold">
            {shown.total}
          </LedgerRow>
          <LedgerRow label="Deposit paid">
            {formatDeduction(props.depositMinor, props.currency)}
          </LedgerRow>
          <BalanceRow balanceMinor={balance} currency={props.currency} />
        </dl>

        <TextAreaField
          name="notes"
          id="inv-notes"
          label="Notes (printed on the invoice)"
          value={notes}
          maxLength={2000}
          rows={2}
          onChange={(e) => {
            setOutcome(null);
            setNotes(e.target.value);
          }}
          error={state.fieldErrors?.notes}
        />
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" disabled={pending} aria-busy={pending}>
            {pending ? "Saving…" : "Save draft"}
          </Button>
          <FormStatus ok={outcome?.ok} message={outcome?.message} />
        </div>
      </form>
      <section className="mt-6" aria-labelledby="issue-h">
        <h3 id="issue-h" className="sr-only">
          Issue
        </h3>
        <p className="mb-2 text-sm text-ink-600">
          {dirty
            ? "Save the draft first: the invoice is issued as saved."
            : `Issuing numbers the invoice and e-mails it to ${props.customerName} with a link to pay; after that it is never edited (a credit note corrects it).`}
        </p>
        {/* Offered only for the draft as saved: never with unsaved edits or a save under way. */}
        <ActionButton
          action={issueInvoiceAction}
          payload={{ id: props.id, version: props.version }}
          label="Issue and e-mail"
          busyLabel="Issuing…"
          disabled={dirty || pending}
          confirm="Issue this invoice? It is numbered, e-mailed and cannot be edited afterwards."
        />
      </section>
    </>
  );
}
