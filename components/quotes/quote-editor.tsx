"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import {
  formatMoney,
  formatScaled,
  minorToPlain,
  parseMoney,
  parseScaled,
} from "@/lib/catalog/money";
import {
  pastValidity,
  QUOTE_STATUS_LABELS,
  quoteLabel,
  quoteMovesOn,
  type QuoteStatus,
} from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";
import {
  changeQuoteStatusAction,
  editQuoteAction,
  reviseQuoteAction,
  sendQuoteAction,
} from "@/lib/quotes/quote-actions";
import {
  quantityTooLarge,
  quoteLimitMessages,
  quoteSizeIssue,
  unitPriceTooLarge,
} from "@/lib/quotes/quote-limits";
import { LABOUR_DESCRIPTION } from "@/lib/quotes/quote-lines";
import { presentQuote } from "@/lib/quotes/quote-presentation";

export interface EditorLine {
  kind: "part" | "labour" | "fee";
  partId: string | null;
  sku: string | null;
  description: string;
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}
interface Row {
  kind: EditorLine["kind"];
  partId: string | null;
  sku: string | null;
  description: string;
  qty: string;
  price: string;
  discount: string;
}
/** What the part search answers (GET /api/v1/parts), as far as a line needs it. */
interface CatalogPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  priceMinor: number;
  stock: number;
  reserved: number;
}

const freeText = (free: number) =>
  free > 0 ? `${free} free` : free < 0 ? `${-free} short` : "none free";

const toRow = (l: EditorLine): Row => ({
  kind: l.kind,
  partId: l.partId,
  sku: l.sku,
  description: l.description,
  qty: formatScaled(l.quantityMilli, 3),
  price: minorToPlain(l.unitPriceMinor),
  discount: formatScaled(l.discountBp, 2),
});
const cell =
  "figure w-full rounded-md border border-ink-300 bg-white px-2 py-1 text-right aria-[invalid=true]:border-danger-600";

const ACTION_LABELS: Partial<Record<QuoteStatus, string>> = {
  accepted: "Mark accepted",
  declined: "Mark declined",
  expired: "Mark expired",
  deposit_paid: "Record deposit paid",
  ordered: "Mark ordered",
};

/**
 * A quote's lines (a draft edited in place; a sent one's edit saved as its next revision),
 * totals worked live in integer cents, workflow and e-mail.
 */
type EditorProps = {
  id: string;
  number: number;
  revision: number;
  version: number;
  status: QuoteStatus;
  /** YYYY-MM-DD (UTC) as the server sees it: the day validity is judged on. */
  today: string;
  currency: string;
  taxRateBp: number;
  validUntil: string;
  notes: string;
  lines: EditorLine[];
  /** The shop's labour rate (minor units an hour): what "Add labour" charges. */
  labourRateMinor: number;
  canWrite: boolean;
  customerEmail: string | null;
};
type Outcome = { ok: boolean; message: string } | null;

/** The fields of one line the editor marks; the schema's keys they stand for. */
type LineField = "description" | "qty" | "price" | "discount";
const FIELD_OF: Record<string, LineField> = {
  description: "description",
  quantityMilli: "qty",
  unitPriceMinor: "price",
  discountBp: "discount",
};
const FIELD_NAMES: Record<LineField, string> = {
  description: "description",
  qty: "quantity",
  price: "unit price",
  discount: "discount",
};
/** The input of line i's field (focused when it is the first one wrong). */
const fieldId = (i: number, f: LineField) => `q-line-${i}-${f}`;
/** Messages per line and field: "0.price" → "At most $1,000,000.00". */
type LineErrors = Record<string, string>;

/** A refused action's message, with the first field's own message when it names fields. */
function refusal(state: ActionState): string {
  const first = Object.values(state.fieldErrors ?? {})[0]?.[0];
  const message = state.message ?? "That did not work";
  return first && first !== message ? `${message}: ${first}` : message;
}

/**
 * The quote editor. The form starts afresh from the saved quote whenever its version changes;
 * the outcome message lives out here so that it survives that fresh start.
 */
export function QuoteEditor(props: EditorProps) {
  const [outcome, setOutcome] = useState<Outcome>(null);
  return (
    <QuoteEditorForm
      key={`${props.id}-${props.version}`}
      {...props}
      outcome={outcome}
      setOutcome={setOutcome}
    />
  );
}

function QuoteEditorForm({
  outcome: status,
  setOutcome: setStatus,
  ...props
}: EditorProps & { outcome: Outcome; setOutcome: (o: Outcome) => void }) {
  const router = useRouter();
  const editable = props.canWrite && (props.status === "draft" || props.status === "sent");
  const [rows, setRows] = useState<Row[]>(props.lines.map(toRow));
  const [validUntil, setValidUntil] = useState(props.validUntil);
  const [notes, setNotes] = useState(props.notes);
  const [pending, start] = useTransition();
  const [busy, setBusy] = useState("");
  /** What the server said of a line's field on the last save (until that line is edited). */
  const [serverErrors, setServerErrors] = useState<LineErrors>({});
  const limits = quoteLimitMessages(props.currency);

  const parsed = rows.map((r) => ({
    quantityMilli: parseScaled(r.qty, 3),
    unitPriceMinor: parseMoney(r.price),
    discountBp: r.discount.trim() === "" ? 0 : parseScaled(r.discount, 2),
  }));
  // The same presentation as the PDF, the portal and the e-mail (a line being typed counts as 0).
  const shown = presentQuote(
    { currency: props.currency, taxRateBp: props.taxRateBp },
    parsed.map((p, i) => ({
      kind: rows[i]!.kind,
      sku: rows[i]!.sku,
      description: rows[i]!.description,
      quantityMilli: p.quantityMilli ?? 0,
      unitPriceMinor: p.unitPriceMinor ?? 0,
      discountBp: Math.min(p.discountBp ?? 0, 10000),
    })),
  );
  // Each line's fields as the person typed them, checked here with the limits the server keeps
  // (a message saying the limit, money in the quote's currency), plus what the server said.
  const lineErrors: LineErrors = {
    ...serverErrors,
    ...Object.fromEntries(rows.flatMap((r, i) => checkLine(r, parsed[i]!, limits, i))),
  };
  const errorOf = (i: number, f: LineField) => lineErrors[`${i}.${f}`];
  const linesGood = Object.keys(lineErrors).length === 0;
  const sizeMessage = linesGood
    ? quoteSizeIssue(
        parsed.map((p) => ({
          quantityMilli: p.quantityMilli!,
          unitPriceMinor: p.unitPriceMinor!,
          discountBp: p.discountBp ?? 0,
        })),
        props.currency,
      )
    : null;
  const allGood = linesGood && !sizeMessage;
  /** "Line 1 unit price: At most $1,000,000.00" for the first field wrong, focused. */
  const firstError = (errors: LineErrors) => {
    const first = rows
      .flatMap((_, i) =>
        (["description", "qty", "price", "discount"] as const).map((f) => [i, f] as const),
      )
      .find(([i, f]) => errors[`${i}.${f}`]);
    if (!first) return null;
    const [i, f] = first;
    return { id: fieldId(i, f), text: `Line ${i + 1} ${FIELD_NAMES[f]}: ${errors[`${i}.${f}`]}` };
  };
  const focusFirst = (errors: LineErrors) => {
    const first = firstError(errors);
    if (first) requestAnimationFrame(() => document.getElementById(first.id)?.focus());
    return first;
  };
  const invalidProps = (i: number, f: LineField) =>
    errorOf(i, f)
      ? { "aria-invalid": true, "aria-describedby": `${fieldId(i, f)}-error` }
      : { "aria-invalid": false };
  const revises = props.status === "sent";
  const label = (revision: number) => quoteLabel(props.number, revision);
  const dated = { status: props.status, validUntil: props.validUntil };
  const lapsed = pastValidity(dated, props.today);
  const moves = quoteMovesOn(dated, props.today).filter((s) => s !== "sent");
  const money = (m: number) => formatMoney(m, props.currency);
  const setRow = (i: number, patch: Partial<Row>) => {
    setRows((rs) => rs.map((r, k) => (k === i ? { ...r, ...patch } : r)));
    setServerErrors((e) =>
      Object.fromEntries(Object.entries(e).filter(([k]) => !k.startsWith(`${i}.`))),
    );
  };
  /** Lines added or removed renumber them: what the server said no longer points anywhere. */
  const changeRows = (f: (rs: Row[]) => Row[]) => {
    setRows(f);
    setServerErrors({});
  };

  const save = () => {
    if (!allGood) {
      const first = focusFirst(lineErrors);
      setStatus({
        ok: false,
        message: first
          ? `Check the highlighted fields: ${first.text}`
          : (sizeMessage ?? "Check the lines"),
      });
      return;
    }
    start(async () => {
      const lines = rows.map((r, i) => ({
        kind: r.kind,
        partId: r.partId,
        sku: r.sku,
        description: r.description,
        quantityMilli: parsed[i]!.quantityMilli!,
        unitPriceMinor: parsed[i]!.unitPriceMinor!,
        discountBp: parsed[i]!.discountBp ?? 0,
      }));
      const res = await editQuoteAction(initialActionState, {
        id: props.id,
        version: props.version,
        validUntil,
        notes,
        lines,
      });
      if (res.ok && res.data && res.data.id !== props.id) {
        // A sent quote's edit is its next revision: show that one (a draft to send).
        setStatus({ ok: true, message: `Saved as ${label(res.data.revision)}, a draft` });
        router.push(`/quotes/${res.data.id}`);
        return;
      }
      if (res.ok) {
        setStatus({ ok: true, message: "Quote saved" });
        return;
      }
      // A line's field the server refused (lines.0.unitPriceMinor): marked on that line.
      const fromServer: LineErrors = {};
      for (const [path, messages] of Object.entries(res.fieldErrors ?? {})) {
        const m = /^lines\.(\d+)\.(\w+)$/.exec(path);
        const f = m && Object.hasOwn(FIELD_OF, m[2]!) ? FIELD_OF[m[2]!] : undefined;
        if (m && f && Number(m[1]) < rows.length) fromServer[`${m[1]}.${f}`] = messages[0]!;
      }
      setServerErrors(fromServer);
      const first = focusFirst(fromServer);
      setStatus({
        ok: false,
        message: first
          ? `${res.message ?? "Check the highlighted fields"}: ${first.text}`
          : refusal(res),
      });
    });
  };
  /** Runs a quote action; the page shows the result (the action revalidates it). */
  const run = <T,>(
    label: string,
    done: string,
    call: () => Promise<ActionState<T>>,
    then?: (data: T) => void,
  ) =>
    start(async () => {
      setBusy(label);
      const res = await call();
      setBusy("");
      setStatus(res.ok ? { ok: true, message: done } : { ok: false, message: refusal(res) });
      if (res.ok && then) then(res.data as T);
    });

  // Labour is one line at the shop's rate: when the quote has it (a kit's quote does), the
  // button takes the counter to its hours instead of adding it again.
  const labourAt = rows.findIndex((r) => r.kind === "labour");
  const addLabour = () => {
    if (labourAt >= 0) {
      document.getElementById(fieldId(labourAt, "qty"))?.focus();
      setStatus({
        ok: true,
        message: `Labour is already on line ${labourAt + 1}; change its hours there`,
      });
      return;
    }
    changeRows((rs) => [
      ...rs,
      {
        kind: "labour",
        partId: null,
        sku: null,
        description: LABOUR_DESCRIPTION,
        qty: "1",
        price: minorToPlain(props.labourRateMinor),
        discount: "0",
      },
    ]);
  };

  const dirty =
    JSON.stringify(rows) !== JSON.stringify(props.lines.map(toRow)) ||
    validUntil !== props.validUntil ||
    notes !== props.notes;

  return (
    <div className="space-y-4">
      {editable && revises ? (
        <p
          className="rounded-md border-l-4 border-caution-600 bg-caution-50 px-3 py-2 text-sm text-ink-800"
          data-testid="revision-notice"
        >
          This quote was sent to the customer, so it is not changed under them. Editing makes
          revision {props.revision + 1} ({label(props.revision + 1)}), a draft; the customer sees it
          after you send it. Saving replaces {label(props.revision)} at once: the customer&apos;s
          link to it then says it was replaced, with nothing to accept.
        </p>
      ) : null}
      {lapsed ? (
        <p
          className="rounded-md border-l-4 border-caution-600 bg-caution-50 px-3 py-2 text-sm text-ink-800"
          data-testid="lapsed-notice"
        >
          Valid until {formatCalendarDate(props.validUntil)}: past that day it can no longer be
          accepted, declined or paid.{" "}
          {revises
            ? "Edit it to make a new revision with a new date, and send that."
            : "Mark it expired, or revise it."}
        </p>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
        <table className="table-cards w-full text-left text-sm">
          <thead className="bg-ink-100 text-ink-700">
            <tr>
              <th scope="col" className="px-3 py-2">
                Line
              </th>
              <th scope="col" className="w-24 px-3 py-2 text-right">
                Qty
              </th>
              <th scope="col" className="w-32 px-3 py-2 text-right">
                Unit price
              </th>
              <th scope="col" className="w-24 px-3 py-2 text-right">
                Discount %
              </th>
              <th scope="col" className="w-32 px-3 py-2 text-right">
                Line total
              </th>
              {editable ? (
                <th scope="col" className="px-3 py-2">
                  <span className="sr-only">Remove</span>
                </th>
              ) : null}
            </tr>
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-4 text-ink-600">
                  No lines yet: add parts, labour or a fee below.
                </td>
              </tr>
            ) : null}
            {rows.map((r, i) => (
              <tr key={i} className="border-t border-ink-100">
                <td className="card-wide px-3 py-2">
                  {editable ? (
                    <>
                      {/* One line of text that wraps to its full length (a phone shows every
                          word): a box that grows with its content, Enter taking no new line. */}
                      <textarea
                        id={fieldId(i, "description")}
                        aria-label={`Line ${i + 1} description`}
                        {...invalidProps(i, "description")}
                        rows={1}
                        className="block [field-sizing:content] w-full resize-none rounded-md border border-ink-300 px-2 py-1 aria-[invalid=true]:border-danger-600"
                        value={r.description}
                        onKeyDown={(e) => {
                          if (e.key === "Enter") e.preventDefault();
                        }}
                        onChange={(e) =>
                          setRow(i, { description: e.target.value.replace(/[\r\n]+/g, " ") })
                        }
                      />
                      <FieldMessage
                        id={`${fieldId(i, "description")}-error`}
                        text={errorOf(i, "description")}
                      />
                    </>
                  ) : (
                    r.description
                  )}
                  <span className="block text-xs text-ink-600">
                    {r.kind}
                    {r.sku ? ` · ${r.sku}` : ""}
                  </span>
                </td>
                <td className="px-3 py-2 text-right" data-label="Qty">
                  {editable ? (
                    <>
                      <input
                        id={fieldId(i, "qty")}
                        aria-label={`Line ${i + 1} quantity`}
                        {...invalidProps(i, "qty")}
                        inputMode="decimal"
                        className={cell}
                        value={r.qty}
                        onChange={(e) => setRow(i, { qty: e.target.value })}
                      />
                      <FieldMessage id={`${fieldId(i, "qty")}-error`} text={errorOf(i, "qty")} />
                    </>
                  ) : (
                    r.qty
                  )}
                </td>
                <td className="px-3 py-2 text-right" data-label="Unit price">
                  {editable ? (
                    <>
                      <input
                        id={fieldId(i, "price")}
                        aria-label={`Line ${i + 1} unit price`}
                        {...invalidProps(i, "price")}
                        inputMode="decimal"
                        className={cell}
                        value={r.price}
                        onChange={(e) => setRow(i, { price: e.target.value })}
                      />
                      <FieldMessage
                        id={`${fieldId(i, "price")}-error`}
                        text={errorOf(i, "price")}
                      />
                    </>
                  ) : (
                    <span className="figure">{shown.lines[i]!.unitPrice}</span>
                  )}
                </td>
                <td className="px-3 py-2 text-right" data-label="Discount %">
                  {editable ? (
                    <>
                      <input
                        id={fieldId(i, "discount")}
                        aria-label={`Line ${i + 1} discount`}
                        {...invalidProps(i, "discount")}
                        inputMode="decimal"
                        className={cell}
                        value={r.discount}
                        onChange={(e) => setRow(i, { discount: e.target.value })}
                      />
                      <FieldMessage
                        id={`${fieldId(i, "discount")}-error`}
                        text={errorOf(i, "discount")}
                      />
                      {shown.lines[i]!.discountAmount ? (
                        <span className="figure block text-xs text-ink-600">
                          {shown.lines[i]!.discountAmount}
                        </span>
                      ) : null}
                    </>
                  ) : (
                    <span className="figure">{shown.lines[i]!.discount}</span>
                  )}
                </td>
                <td
                  className="figure px-3 py-2 text-right"
                  data-label="Line total"
                  data-testid="line-total"
                >
                  {shown.lines[i]!.lineTotal}
                </td>
                {editable ? (
                  <td className="px-3 py-2 text-right">
                    <Button
                      type="button"
                      variant="ghost"
                      aria-label={`Remove line ${i + 1}`}
                      onClick={() => changeRows((rs) => rs.filter((_, k) => k !== i))}
                    >
                      ✕
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
          <tfoot className="border-t border-ink-200 text-right" data-testid="quote-totals">
            <tr>
              <td colSpan={4} className="px-3 py-1">
                Subtotal
              </td>
              <td className="figure px-3 py-1" data-testid="quote-subtotal">
                {shown.subtotal}
              </td>
            </tr>
            {shown.discountNote ? (
              <tr>
                <td colSpan={5} className="px-3 py-1 text-xs text-ink-600">
                  {shown.discountNote}
                </td>
              </tr>
            ) : null}
            <tr>
              <td colSpan={4} className="px-3 py-1">
                {shown.taxLabel}
              </td>
              <td className="figure px-3 py-1">{shown.tax}</td>
            </tr>
            <tr className="font-semibold">
              <td colSpan={4} className="px-3 py-1">
                Total
              </td>
              <td className="figure px-3 py-1" data-testid="quote-total">
                {shown.total}
              </td>
            </tr>
          </tfoot>
        </table>
      </div>
      {!linesGood && editable ? (
        <p role="alert" className="text-sm text-danger-700">
          ✕ Each line needs a description, a quantity above 0 (up to 3 decimals, at most{" "}
          {limits.quantity.replace("At most ", "")}), a price like 12.50 (
          {limits.unitPrice.toLowerCase()}) and a discount from 0 to 100 %.
        </p>
      ) : null}
      {sizeMessage && editable ? (
        <p role="alert" className="text-sm text-danger-700" data-testid="quote-size-error">
          ✕ {sizeMessage}
        </p>
      ) : null}
      {editable ? (
        <div className="flex flex-wrap items-end gap-3 print:hidden">
          <SearchCombobox<{ parts: CatalogPart[] }, CatalogPart>
            label="Add a part"
            placeholder="Type a SKU, name or brand"
            url={(q) => `/api/v1/parts?${new URLSearchParams({ q, sort: "name", limit: "8" })}`}
            options={(r) =>
              r.parts.map((p) => ({
                id: p.id,
                label: `${p.sku} — ${p.brand} ${p.name}`,
                detail: `${money(p.priceMinor)} · ${freeText(p.stock - p.reserved)}`,
                value: p,
              }))
            }
            empty="No part matches; try another SKU, name or brand"
            onPick={(p) =>
              changeRows((rs) => [
                ...rs,
                {
                  kind: "part",
                  partId: p.id,
                  sku: p.sku,
                  description: `${p.brand} ${p.name}`,
                  qty: "1",
                  price: minorToPlain(p.priceMinor),
                  discount: "0",
                },
              ])
            }
          />
          <Button type="button" variant="secondary" onClick={addLabour}>
            {labourAt >= 0 ? "Labour hours" : "Add labour"}
          </Button>
          <Button
            type="button"
            variant="secondary"
            onClick={() =>
              changeRows((rs) => [
                ...rs,
                {
                  kind: "fee",
                  partId: null,
                  sku: null,
                  description: "Dyno session",
                  qty: "1",
                  price: "0.00",
                  discount: "0",
                },
              ])
            }
          >
            Add fee
          </Button>
        </div>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="q-valid" className="block text-sm font-medium text-ink-700">
            Valid until
          </label>
          <input
            id="q-valid"
            type="date"
            disabled={!editable}
            value={validUntil}
            onChange={(e) => setValidUntil(e.target.value)}
            className="mt-1 rounded-md border border-ink-300 bg-white px-3 py-2"
          />
        </div>
        {/* An empty notes box is an editing aid: not printed. */}
        <div className={notes.trim() ? undefined : "print:hidden"}>
          <label htmlFor="q-notes" className="block text-sm font-medium text-ink-700">
            Notes for the customer
          </label>
          <textarea
            id="q-notes"
            disabled={!editable}
            value={notes}
            onChange={(e) => setNotes(e.target.value)}
            rows={2}
            className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2"
          />
        </div>
      </div>
      {props.canWrite ? (
        <div className="flex flex-wrap items-center gap-3 border-t border-ink-200 pt-3">
          {editable ? (
            <Button onClick={save} disabled={pending || !dirty}>
              {pending && !busy
                ? "Saving…"
                : revises
                  ? `Save as revision ${props.revision + 1}`
                  : "Save quote"}
            </Button>
          ) : null}
          {editable ? (
            <Button
              variant="secondary"
              disabled={pending || dirty || rows.length === 0 || !props.customerEmail}
              title={
                !props.customerEmail
                  ? "The customer has no e-mail address"
                  : dirty
                    ? "Save first"
                    : undefined
              }
              onClick={() =>
                run("send", `Sent to ${props.customerEmail}`, () =>
                  sendQuoteAction(initialActionState, { id: props.id }),
                )
              }
            >
              {busy === "send"
                ? "Sending…"
                : props.status === "sent"
                  ? "Send again"
                  : "Send to customer"}
            </Button>
          ) : null}
          {moves.map((s) => (
            <Button
              key={s}
              variant={s === "declined" || s === "expired" ? "ghost" : "secondary"}
              disabled={pending || dirty}
              onClick={() => {
                if (
                  (s === "declined" || s === "expired") &&
                  !window.confirm(`${ACTION_LABELS[s]}? Stock held for it is released.`)
                )
                  return;
                run(s, `Quote is now ${QUOTE_STATUS_LABELS[s].toLowerCase()}`, () =>
                  changeQuoteStatusAction(initialActionState, { id: props.id, status: s }),
                );
              }}
            >
              {ACTION_LABELS[s] ?? s}
            </Button>
          ))}
          {props.status === "accepted" ? (
            <Button
              variant="secondary"
              disabled={pending}
              onClick={() =>
                window.confirm(
                  "Make a new editable revision? This one is replaced and its stock released.",
                ) &&
                run(
                  "revise",
                  "New revision made",
                  () => reviseQuoteAction(initialActionState, { id: props.id }),
                  (revision) => router.push(`/quotes/${revision.id}`),
                )
              }
            >
              Revise quote
            </Button>
          ) : null}
          <FormStatus ok={status?.ok} message={status?.message} />
        </div>
      ) : null}
    </div>
  );
}

/** A line field's own message under it (the input names it with aria-describedby). */
function FieldMessage({ id, text }: { id: string; text?: string }) {
  return text ? (
    <span id={id} className="block text-left text-xs text-danger-700">
      {text}
    </span>
  ) : null;
}

/** One line's own problems as [`${i}.${field}`, message] pairs, the limits said as money. */
function checkLine(
  r: Row,
  p: { quantityMilli: number | null; unitPriceMinor: number | null; discountBp: number | null },
  limits: ReturnType<typeof quoteLimitMessages>,
  i: number,
): [string, string][] {
  const out: [string, string][] = [];
  if (!r.description.trim()) out.push([`${i}.description`, "Describe the line"]);
  if (p.quantityMilli === null || p.quantityMilli === 0)
    out.push([`${i}.qty`, `Above 0, up to 3 decimals, ${limits.quantity.toLowerCase()}`]);
  else if (quantityTooLarge(p.quantityMilli)) out.push([`${i}.qty`, limits.quantity]);
  if (p.unitPriceMinor === null)
    out.push([`${i}.price`, `A price like 12.50, ${limits.unitPrice.toLowerCase()}`]);
  else if (unitPriceTooLarge(p.unitPriceMinor)) out.push([`${i}.price`, limits.unitPrice]);
  if (p.discountBp === null || p.discountBp > 10000) out.push([`${i}.discount`, "From 0 to 100 %"]);
  return out;
}
