import "server-only";

import { getBuild } from "@/db/queries/builds";
import { createQuote, getQuote, recordQuoteSent } from "@/db/queries/quotes";
import { NotFound } from "@/lib/domain/errors";
import { quoteLabel } from "@/lib/domain/quotes";
import { serverEnv } from "@/lib/env";
import { HttpError } from "@/lib/http/http-error";
import { sendMail } from "@/lib/mail";
import { portalInviteLink } from "@/lib/portal/invite";

import { formatMoney } from "./money";
import { linesFromBuild } from "./service";

/** A draft quote from a build's chosen parts (and a labour line), or an empty one for a customer. */
export async function quoteFromBuild(
  shopId: string,
  userId: string,
  v: { buildId?: string; customerId?: string; validUntil?: string; labourHours?: number },
) {
  if (v.buildId) {
    const row = await getBuild(shopId, v.buildId);
    if (!row) throw new HttpError(422, "invalid_input", "That build is not in this shop");
    const lines = await linesFromBuild(shopId, row.build.parts, v.labourHours ?? 4);
    return createQuote(shopId, userId, {
      customerId: row.build.customerId,
      buildId: row.build.id,
      validUntil: v.validUntil,
      lines,
      notes: `For ${row.build.title}`,
    });
  }
  return createQuote(shopId, userId, {
    customerId: v.customerId!,
    validUntil: v.validUntil,
    lines: [],
  });
}

/**
 * E-mails the quote to its customer with a summary and a portal link, then logs the message and
 * moves a draft to sent. A failed send changes nothing and says why.
 */
export async function sendQuote(shopId: string, shopName: string, userId: string, id: string) {
  const q = await getQuote(shopId, id);
  if (!q) throw new NotFound("That quote");
  if (!["draft", "sent"].includes(q.quote.status))
    throw new HttpError(422, "invalid_transition", "Only a draft or sent quote is e-mailed");
  if (!q.customerEmail)
    throw new HttpError(
      422,
      "no_email",
      `${q.customerName} has no e-mail address; add one on the customer's page`,
    );
  if (q.lines.length === 0)
    throw new HttpError(422, "empty_quote", "Add at least one line before sending the quote");
  const label = quoteLabel(q.quote.number, q.quote.revision);
  const subject = `${shopName}: quote ${label} for your fuel system`;
  const link = `${serverEnv().APP_URL}/my/quotes/${id}`;
  // A customer without a portal sign-in gets the invitation in this same e-mail.
  const invite = q.customerUserId ? null : await portalInviteLink(shopId, userId, q.customerEmail);
  const money = (m: number) => formatMoney(m, q.quote.currency);
  const text = [
    `Hello ${q.customerName},`,
    "",
    `Here is quote ${label}${q.buildTitle ? ` for ${q.buildTitle}` : ""}, valid until ${q.quote.validUntil}.`,
    "",
    ...q.lines.map(
      (l) =>
        `  ${(l.quantityMilli / 1000).toString().padStart(6)} × ${l.description} — ${money(Math.round((l.quantityMilli * l.unitPriceMinor) / 1000))}${l.discountBp ? ` less ${l.discountBp / 100} %` : ""}`,
    ),
    "",
    `Subtotal ${money(q.quote.subtotalMinor)}${q.quote.discountMinor ? `, discounts −${money(q.quote.discountMinor)}` : ""}, tax ${money(q.quote.taxMinor)}`,
    `Total ${money(q.quote.totalMinor)}`,
    "",
    ...(invite
      ? [
          `To see it, accept or decline it and pay the deposit, first set your password for the shop's customer portal (valid 14 days):`,
          invite,
          "",
          `Afterwards the quote is here: ${link}`,
        ]
      : [`See it, and accept or decline it, in your portal: ${link}`]),
    "",
    "Fuel system work must be done and checked by qualified people, to your local codes.",
    `— ${shopName}`,
  ].join("\n");
  let messageId: string | null;
  try {
    ({ messageId } = await sendMail({ to: q.customerEmail, subject, text }));
  } catch (e) {
    const why =
      (e as { code?: string; message?: string }).code === "ECONNREFUSED"
        ? "the mail server is not answering"
        : ((e as Error).message ?? "the mail server refused it");
    throw new HttpError(
      502,
      "mail_failed",
      `The quote was not sent: ${why}. It is unchanged; try again.`,
    );
  }
  await recordQuoteSent(shopId, id, userId, { to: q.customerEmail, subject, messageId });
  return { to: q.customerEmail, subject, invited: Boolean(invite) };
}
