import "server-only";

import { randomBytes } from "node:crypto";

import { getBuild } from "@/db/queries/builds";
import { getCustomer } from "@/db/queries/customers";
import { sameLines } from "@/db/queries/document-lines";
import { getPartsByIds } from "@/db/queries/parts";
import {
  expireQuotes,
  findPortalInvitation,
  getQuote,
  insertQuote,
  insertRevision,
  recordQuoteSent,
  setQuoteStatus,
  updateQuote,
  type QuoteRow,
} from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import {
  Conflict,
  Invalid,
  InvalidTransition,
  NotFound,
  Unavailable,
  type FieldIssue,
} from "@/lib/domain/errors";
import {
  pastValidity,
  QUOTE_EDITABLE,
  QUOTE_NEXT,
  QUOTE_REVISED_ON_EDIT,
  QUOTE_STATUS_LABELS,
  quoteLabel,
  quoteMovesOn,
  type QuoteStatus,
} from "@/lib/domain/quotes";
import { serverEnv } from "@/lib/env";
import { sendMail } from "@/lib/mail";
import { notifyShop } from "@/lib/notices/notice-commands";
import { recordCounterDeposit } from "@/lib/payments/payment-commands";
import { renderQuoteSheet } from "@/lib/pdf/quote-sheet";
import { quotePdfName, quoteSheetData } from "@/lib/pdf/quote-sheet-data";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { renderSpecSheet } from "@/lib/pdf/spec-sheet";
import { pdfFileName, specSheetData } from "@/lib/pdf/spec-sheet-data";
import { shopToday } from "@/lib/shop/shop-zone";
import type { QuoteCreate, QuoteEdit, QuoteLineInput } from "@/lib/validations/quotes";

import { quoteEmail } from "./quote-email";
import { quoteSizeIssue } from "./quote-limits";
import { linesFromBuild, withLabour } from "./quote-lines";
import { presentQuote } from "./quote-presentation";

type QuoteFields = Omit<QuoteEdit, "id" | "version">;

/**
 * Every write on a quote: one command each, called alike by the server actions
 * (lib/quotes/quote-actions.ts), the JSON API (app/api/v1/quotes) and the pages. Each checks
 * the member's role, then the quote's state, then writes in one transaction; refusals are
 * domain errors (lib/domain/errors.ts).
 */

/** Labour hours a quote from a build starts with when none are given. */
const DEFAULT_LABOUR_HOURS = 4;
/** Labour rate (minor units per hour) when the shop has no settings row yet. */
const DEFAULT_LABOUR_RATE_MINOR = 12000;

const lower = (s: QuoteStatus) => QUOTE_STATUS_LABELS[s].toLowerCase();

async function quoteOf(member: Member, id: string, own = false) {
  const q = await getQuote(member.shopId, id, own ? member.user.id : undefined);
  if (!q) throw new NotFound("That quote");
  return q;
}

/** Part lines must name parts of the member's shop: each one that does not is a field error. */
async function checkLineParts(shopId: string, lines: QuoteLineInput[]) {
  const ids = [...new Set(lines.flatMap((l) => (l.partId ? [l.partId] : [])))];
  if (ids.length === 0) return;
  const found = new Set((await getPartsByIds(shopId, ids)).map((p) => p.id));
  const issues: FieldIssue[] = lines.flatMap((l, i) =>
    l.partId && !found.has(l.partId)
      ? [{ path: `lines.${i}.partId`, message: "That part is not in this shop's catalog" }]
      : [],
  );
  if (issues.length)
    throw new Invalid("A line names a part that is not in this shop's catalog", issues);
}

/** The shop's labour rate (minor units an hour) and currency (what a new quote is priced in). */
async function shopQuoteTerms(shopId: string): Promise<{ rateMinor: number; currency: string }> {
  const s = (await getShopSettings(shopId))?.settings;
  return {
    rateMinor: s?.labourRateMinor ?? DEFAULT_LABOUR_RATE_MINOR,
    currency: s?.currency ?? "USD",
  };
}

/**
 * Lines that add up to more than one quote holds: a field error, the limit said as money in the
 * quote's currency — on the labour hours when the shop's labour line made them too much.
 */
function checkQuoteSize(lines: QuoteLineInput[], currency: string, onLabour = false) {
  const message = quoteSizeIssue(
    lines,
    currency,
    onLabour ? "With this labour the quote adds up" : undefined,
  );
  if (message) throw Invalid.field(onLabour ? "labourHours" : "lines", message);
}

/**
 * A draft quote: from a build (its chosen parts at today's prices and a labour line at the
 * shop's rate, for the build's customer), or a parts-only quote for a customer — no build
 * needed — with the lines given (their parts must be in the shop's catalog) and, when
 * `labourHours` is given, one labour line at the shop's rate unless the lines carry labour.
 */
export async function createQuote(member: Member, input: QuoteCreate): Promise<QuoteRow> {
  authorize(member, "quotes:write");
  const { shopId } = member;
  if (input.buildId) {
    const row = await getBuild(shopId, input.buildId);
    if (!row) throw Invalid.field("buildId", "That build is not in this shop");
    const [catalog, { rateMinor, currency }] = await Promise.all([
      getPartsByIds(
        shopId,
        row.build.parts.map((p) => p.partId),
      ),
      shopQuoteTerms(shopId),
    ]);
    const lines = linesFromBuild(row.build.parts, catalog, {
      hours: input.labourHours ?? DEFAULT_LABOUR_HOURS,
      rateMinor,
    });
    checkQuoteSize(lines, currency, true);
    return insertQuote(shopId, member.user.id, {
      customerId: row.build.customerId,
      buildId: row.build.id,
      validUntil: input.validUntil,
      lines,
      notes: input.notes ?? `For ${row.build.title}`,
    });
  }
  const customer = await getCustomer(shopId, input.customerId!);
  if (!customer) throw Invalid.field("customerId", "That customer is not in this shop");
  const given = input.lines ?? [];
  const { rateMinor, currency } = await shopQuoteTerms(shopId);
  checkQuoteSize(given, currency);
  await checkLineParts(shopId, given);
  const lines = input.labourHours
    ? withLabour(given, { hours: input.labourHours, rateMinor })
    : given;
  checkQuoteSize(lines, currency, true);
  return insertQuote(shopId, member.user.id, {
    customerId: customer.id,
    validUntil: input.validUntil,
    lines,
    notes: input.notes || undefined,
  });
}

/** The stored quote already says what the edit says (an absent field says nothing). */
function unchanged(q: NonNullable<Awaited<ReturnType<typeof getQuote>>>, edit: QuoteFields) {
  return (
    (edit.validUntil === undefined || edit.validUntil === q.quote.validUntil) &&
    (edit.notes === undefined || edit.notes === (q.quote.notes ?? "")) &&
    (edit.lines === undefined || sameLines(q.lines, edit.lines))
  );
}

/**
 * Saves the fields given (lines, validity, notes; an absent one is left as it is) if the quote
 * is still at the version the edit started from; else Conflict with the quote as it is now, and
 * nothing is overwritten. A draft is edited in place. A sent quote is never changed under the
 * customer: the edit becomes its next revision (same number, revision + 1, a draft to send
 * again) and the sent one is superseded, in one transaction; the answer is the new revision.
 * An edit that changes nothing writes nothing and answers with the quote as it is.
 */
export async function editQuote(member: Member, input: QuoteEdit): Promise<QuoteRow> {
  authorize(member, "quotes:write");
  const { id, version, ...fields } = input;
  const q = await quoteOf(member, id);
  const status = q.quote.status;
  const revise = QUOTE_REVISED_ON_EDIT.includes(status);
  if (!QUOTE_EDITABLE.includes(status) && !revise)
    throw new InvalidTransition(
      status === "accepted"
        ? "An accepted quote cannot be edited; make a new revision of it instead"
        : `A quote that is ${lower(status)} cannot be edited`,
    );
  if (fields.lines) {
    checkQuoteSize(fields.lines, q.quote.currency);
    await checkLineParts(member.shopId, fields.lines);
  }
  if (version === q.quote.version && unchanged(q, fields)) return q.quote;
  return revise
    ? insertRevision(member.shopId, id, member.user.id, {
        from: QUOTE_REVISED_ON_EDIT,
        expectedVersion: version,
        edit: fields,
      })
    : updateQuote(member.shopId, id, version, fields);
}

/**
 * The files a sent quote carries: its PDF as the customer will read it (sent, with the deposit
 * asked) and, where the quote is for a build, the build's spec sheet (its latest revision, in
 * the customer's units where they set them). Rendered through the same cache as the downloads.
 */
async function quoteAttachments(
  shopId: string,
  quote: QuoteRow,
  customerUserId: string | null,
): Promise<{ filename: string; content: Buffer; contentType: string }[]> {
  const sheet = await quoteSheetData(shopId, quote.id, undefined, { asSent: true });
  const files = [
    {
      filename: quotePdfName(sheet.quote.label),
      content: await cachedPdf("quote-sheet", sheet, renderQuoteSheet),
      contentType: "application/pdf",
    },
  ];
  const build = quote.buildId
    ? await specSheetData(shopId, quote.buildId, { viewerId: customerUserId ?? undefined }).catch(
        (e: unknown) => {
          // A build deleted since the quote was made has no sheet to send; the quote still goes.
          if (e instanceof NotFound) return null;
          throw e;
        },
      )
    : null;
  if (build)
    files.push({
      filename: pdfFileName(build.build.title, build.build.version),
      content: await cachedPdf("spec-sheet", build, renderSpecSheet),
      contentType: "application/pdf",
    });
  return files;
}

/**
 * E-mails a draft or sent quote to its customer (with a portal invitation when they have no
 * sign-in yet), then — only once the mail server took it — logs the message, records the
 * invitation and moves a draft to sent. A failed send writes nothing; a quote past its
 * valid-until day is not sent.
 */
export async function sendQuote(
  member: Member,
  input: { id: string },
): Promise<{ to: string; subject: string; invited: boolean }> {
  authorize(member, "quotes:write");
  const { shopId } = member;
  const q = await quoteOf(member, input.id);
  if (q.quote.status !== "draft" && q.quote.status !== "sent")
    throw new InvalidTransition("Only a draft or sent quote is e-mailed");
  const to = q.customerEmail;
  if (!to)
    throw new Invalid(
      `${q.customerName} has no e-mail address; add one on the customer's page`,
      [],
      "no_email",
    );
  if (q.lines.length === 0)
    throw new Invalid("Add at least one line before sending the quote", [], "empty_quote");
  // A quote sent past its date could not be accepted: nothing is sent that the customer cannot take up.
  if (q.quote.validUntil < (await shopToday(shopId)))
    throw q.quote.status === "draft"
      ? Invalid.field("validUntil", "Valid until is in the past; set a later date before sending")
      : new InvalidTransition(
          `This quote was valid until ${q.quote.validUntil}; edit it to make a new revision with a later date, and send that`,
          "quote_expired",
        );

  const appUrl = serverEnv().APP_URL;
  // A customer without a portal sign-in gets the invitation in this same e-mail: the open one
  // if there is one, else a new one, recorded only once the e-mail is out.
  const open = q.customerUserId ? null : await findPortalInvitation(shopId, to);
  const invitationId = q.customerUserId
    ? null
    : (open?.id ?? randomBytes(24).toString("base64url"));
  const attachments = await quoteAttachments(shopId, q.quote, q.customerUserId);
  const { subject, text } = quoteEmail({
    shopName: member.shopName,
    customerName: q.customerName,
    buildTitle: q.buildTitle,
    quote: q.quote,
    presented: presentQuote(q.quote, q.lines),
    link: `${appUrl}/my/quotes/${q.quote.id}`,
    invite: invitationId ? `${appUrl}/accept-invitation/${invitationId}` : null,
    attachments: attachments.map((a) => a.filename),
  });

  let messageId: string | null;
  try {
    ({ messageId } = await sendMail({ to, subject, text, attachments }));
  } catch (e) {
    const why =
      (e as { code?: string }).code === "ECONNREFUSED"
        ? "the mail server is not answering"
        : ((e as Error).message ?? "the mail server refused it");
    throw new Unavailable(
      `The quote was not sent: ${why}. It is unchanged; try again.`,
      "mail_failed",
      "upstream",
    );
  }
  await recordQuoteSent(
    shopId,
    q.quote.id,
    member.user.id,
    { to, subject, messageId },
    invitationId && !open ? { id: invitationId, email: to } : null,
  );
  return { to, subject, invited: Boolean(invitationId) };
}

/**
 * Moves a quote one step along its workflow (QUOTE_NEXT): accepting holds its parts' stock,
 * declining or expiring an accepted quote releases it. Once past its valid-until day (judged
 * now, whatever the stored status) it is no longer accepted, declined or paid (422
 * quote_expired). Asking for the status it has changes nothing. "Deposit paid" records the
 * deposit taken at the counter as a payment (recordCounterDeposit) with the move.
 */
export async function changeQuoteStatus(
  member: Member,
  input: { id: string; status: QuoteStatus },
): Promise<QuoteRow> {
  authorize(member, "quotes:write");
  const q = (await quoteOf(member, input.id)).quote;
  if (q.status === input.status) return q;
  if (!QUOTE_NEXT[q.status].includes(input.status))
    throw new InvalidTransition(
      `A quote cannot go from ${QUOTE_STATUS_LABELS[q.status]} to ${QUOTE_STATUS_LABELS[input.status]}`,
    );
  if (!quoteMovesOn(q, await shopToday(member.shopId)).includes(input.status))
    throw new InvalidTransition(
      `This quote was valid until ${q.validUntil}: it can no longer be accepted, declined or paid. Mark it expired, or ${q.status === "sent" ? "edit it to make a new revision to send" : "revise it"}.`,
      "quote_expired",
    );
  // "Deposit paid" is a payment, never a bare status: the deposit taken at the counter is
  // recorded (its amount worked out by the shop's terms) and the quote moves with it.
  if (input.status === "deposit_paid") {
    await recordCounterDeposit(member, q.id);
    return (await quoteOf(member, q.id)).quote;
  }
  const done = await setQuoteStatus(member.shopId, q.id, {
    from: q.status,
    to: input.status,
    by: member.user.id,
  });
  await tellShopOfAnswer(member, done);
  return done;
}

/**
 * A new editable revision of an accepted quote (same number, next revision, a draft); the old
 * one is superseded and its stock released.
 */
export async function reviseQuote(member: Member, input: { id: string }): Promise<QuoteRow> {
  authorize(member, "quotes:write");
  const q = (await quoteOf(member, input.id)).quote;
  if (q.status !== "accepted")
    throw new InvalidTransition(
      "Only an accepted quote is revised this way; a draft is edited, and editing a sent quote makes its next revision",
    );
  return insertRevision(member.shopId, q.id, member.user.id, { from: ["accepted"] });
}

/**
 * The customer accepts or declines their own sent quote while it is valid (its valid-until day
 * judged now, whatever the stored status); the time and who are recorded. Any other quote is
 * "not found" to them; one no longer open, replaced or past its date is a conflict (409).
 */
export async function respondToQuote(
  member: Member,
  input: { id: string; decision: "accept" | "decline" },
): Promise<QuoteRow> {
  authorize(member, "quotes:respond");
  const q = (await quoteOf(member, input.id, true)).quote;
  if (q.status === "superseded")
    throw new Conflict(
      "This quote was replaced by a new revision; the shop sends it to you when it is ready",
      "not_open",
    );
  if (q.status !== "sent")
    throw new Conflict("This quote is no longer open for a decision", "not_open");
  if (pastValidity(q, await shopToday(member.shopId)))
    throw new Conflict(
      `This quote was valid until ${q.validUntil} and can no longer be accepted or declined; ask the shop for a new one`,
      "quote_expired",
    );
  const done = await setQuoteStatus(member.shopId, q.id, {
    from: "sent",
    to: input.decision === "accept" ? "accepted" : "declined",
    by: member.user.id,
    portalUserId: member.user.id,
  });
  await tellShopOfAnswer(member, done);
  return done;
}

/** The shop's subscribers hear that a quote was accepted or declined (once per quote). */
async function tellShopOfAnswer(member: Member, q: QuoteRow) {
  if (q.status !== "accepted" && q.status !== "declined") return;
  const row = await getQuote(member.shopId, q.id);
  if (!row) return;
  await notifyShop(
    { shopId: member.shopId, recordKind: "quote", recordId: q.id },
    {
      kind: q.status === "accepted" ? "staff_quote_accepted" : "staff_quote_declined",
      shopName: member.shopName,
      customerName: row.customerName,
      quote: quoteLabel(q.number, q.revision),
      totalMinor: q.totalMinor,
      currency: q.currency,
      link: `${serverEnv().APP_URL}/quotes/${q.id}`,
    },
  );
}

/**
 * The clock's sweep, not a member's command: sent or accepted quotes of every shop past their
 * date become expired and accepted ones release their stock, in one transaction. Started by
 * `instrumentation.ts` at boot and every few minutes; no request runs it, so reads never write.
 * Until it runs, screens and the API show such a quote as expired (`quoteStatusOn`) and every
 * answer to it is refused.
 */
export async function sweepExpiredQuotes(now: Date = new Date()): Promise<{ expired: string[] }> {
  return { expired: await expireQuotes(now) };
}
