"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { QuoteTotalsFoot } from "@/components/quotes/quote-totals";
import { Button } from "@/components/ui/button";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { formatMoney, minorToPlain } from "@/lib/catalog/money";
import {
  pastValidity,
  QUOTE_STATUS_LABELS,
  quoteLabel,
  quoteMovesOn,
  type QuoteStatus,
} from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";
import {
  draftLine,
  LINE_FIELDS,
  lineIssues,
  lineRowOf,
  parseLineRow,
  partLineRow,
  serverLineField,
  type EditedLine,
  type LineField,
  type LineRow as Row,
} from "@/lib/quotes/line-rows";
import {
  changeQuoteStatusAction,
  editQuoteAction,
  reviseQuoteAction,
  sendQuoteAction,
} from "@/lib/quotes/quote-actions";
import { quoteLimitMessages, quoteSizeIssue } from "@/lib/quotes/quote-limits";
import { LABOUR_DESCRIPTION, type PricedPart } from "@/lib/quotes/quote-lines";
import { presentQuote } from "@/lib/quotes/quote-presentation";

/** What the part search answers (GET /api/v1/parts), as far as a line needs it. */
interface CatalogPart extends PricedPart {
  stock: number;
  reserved: number;
}

const freeText = (free: number) =>
  free > 0 ? `${free} free` : free < 0 ? `${-free} short` : "none free";

const cell =
  "figure w-full rounded-md border border-ink-300 bg-white px-2 py-1 text-right aria-[invalid=true]:border-danger-600";

const ACTION_LABELS: Partial<Record<QuoteStatus, string>> = {
  accepted: "Mark accepted",
  declined: "Mark declined",
  expired: "Mark expired",
  deposit_paid: "Record deposit taken at the counter",
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
  /** YYYY-MM-DD on the shop's calendar: the day validity is judged on. */
  today: string;
  currency: string;
  taxRateBp: number;
  validUntil: string;
  /** The deposit the shop's terms ask on this quote's total, in minor units. */
  depositMinor: number;
  notes: string;
  lines: EditedLine[];
  /** The shop's labour rate (minor units an hour): what "Add labour" charges. */
  labourRateMinor: number;
  canWrite: boolean;
  customerEmail: string | null;
};
type Outcome = { ok: boolean; message: string } | null;

/** What a message calls each field of a line. */
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
  const [rows, setRows] = useState<Row[]>(props.lines.map(lineRowOf));
  const [validUntil, setValidUntil] = useState(props.validUntil);
  const [notes, setNotes] = useState(props.notes);
  const [pending, start] = useTransition();
  const [busy, setBusy] = useState("");
  /** What the server said of a line's field on the last save (until that line is edited). */
  const [serverErrors, setServerErrors] = useState<LineErrors>({});
  const limits = quoteLimitMessages(props.currency);

  const parsed = rows.map(parseLineRow);
  // With no problems these are exactly the lines to save.
  const lines = rows.map((r, i) => draftLine(r, parsed[i]!));
  // The same presentation as the PDF, the portal and the e-mail (a line being typed counts as 0).
  const shown = presentQuote({ currency: props.currency, taxRateBp: props.taxRateBp }, lines);
  // Each line's fields as the person typed them, checked here with the limits the server keeps
  // (a message saying the limit, money in the quote's currency), plus what the server said.
  const lineErrors: LineErrors = {
    ...serverErrors,
    ...Object.fromEntries(
      rows.flatMap((r, i) => lineIssues(r, parsed[i]!, limits).map(([f, m]) => [`${i}.${f}`, m])),
    ),
  };
  const errorOf = (i: number, f: LineField) => lineErrors[`${i}.${f}`];
  const linesGood = Object.keys(lineErrors).length === 0;
  const sizeMessage = linesGood ? quoteSizeIssue(lines, props.currency) : null;
  const allGood = linesGood && !sizeMessage;
  /** "Line 1 unit price: At most $1,000,000.00" for the first field wrong, focused. */
  const firstError = (errors: LineErrors) => {
    const first = rows
      .flatMap((_, i) => LINE_FIELDS.map((f) => [i, f] as const))
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
  /** Line i's quantity, unit price or discount input, named "Line 1 unit price", and its message. */
  const numberInput = (i: number, f: "qty" | "price" | "discount") => (
    <>
      <input
        id={fieldId(i, f)}
        aria-label={`Line ${i + 1} ${FIELD_NAMES[f]}`}
        {...invalidProps(i, f)}
        inputMode="decimal"
        className={cell}
        value={rows[i]![f]}
        onChange={(e) => setRow(i, { [f]: e.target.value })}
      />
      <FieldMessage id={`${fieldId(i, f)}-error`} text={errorOf(i, f)} />
    </>
  );
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
        const at = serverLineField(path);
        if (at && at.index < rows.length) fromServer[`${at.index}.${at.field}`] = messages[0]!;
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
    JSON.stringify(rows) !== JSON.stringify(props.lines.map(lineRowOf)) ||
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
                  {editable ? numberInput(i, "qty") : r.qty}
                </td>
                <td className="px-3 py-2 text-right" data-label="Unit price">
                  {editable ? (
                    numberInput(i, "price")
                  ) : (
                    <span className="figure">{shown.lines[i]!.unitPrice}</span>
                  )}
                </td>
                <td className="px-3 py-2 text-right" data-label="Discount %">
                  {editable ? (
                    <>
                      {numberInput(i, "discount")}
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
          <QuoteTotalsFoot presented={shown} testId="quote-totals" />
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
            onPick={(p) => changeRows((rs) => [...rs, partLineRow(p)])}
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
                if (
                  s === "deposit_paid" &&
                  !window.confirm(
                    `Record a deposit of ${money(props.depositMinor)} taken at the counter (cash or the shop's card terminal)? It is recorded as paid now and the customer is sent a receipt.`,
                  )
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
