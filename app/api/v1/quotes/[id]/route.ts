import { getQuote } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import { quoteStatusOn } from "@/lib/domain/quotes";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { editQuote } from "@/lib/quotes/quote-commands";
import { quoteParts } from "@/lib/quotes/quote-stock";
import { shopToday } from "@/lib/shop/shop-zone";
import { QuoteEditSchema } from "@/lib/validations/quotes";

/**
 * GET — the quote with its lines and messages, and `stock`: per line what accepting it now would
 * hold and what is back-ordered until when (a quote that holds stock: what it holds); null for a
 * quote past offering (declined, expired, replaced) and for one whose job is fitted, where
 * `fitted` says what was fitted (its job, when, its invoice); else `fitted` is null.
 */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:view");
  const q = await getQuote(
    m.shopId,
    await uuidParam(ctx, "That quote"),
    ownRecordsOnly(m.role) ? m.user.id : undefined,
  );
  if (!q) throw new NotFound("That quote");
  const { stock, fitted } = await quoteParts(
    m.shopId,
    q.quote,
    quoteStatusOn(q.quote, await shopToday(m.shopId)),
    q.lines,
    { customer: ownRecordsOnly(m.role) },
  );
  return Response.json({ ...q, stock, fitted });
});

/**
 * PATCH with the `version` the edit started from and any of lines, validity and notes: a draft
 * is saved in place; a sent quote's edit is its next revision (answered in `quote`, with its own
 * id) and the sent one is superseded. A stale version → 409 with the quote as it is now in
 * `current`.
 */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That quote");
  const input = QuoteEditSchema.parse({ ...asObject(await readJson(req)), id });
  return Response.json({ quote: await editQuote(m, input) });
});

/** A JSON body that is not an object is parsed as an empty one (its fields are then missing). */
function asObject(body: unknown): object {
  return body && typeof body === "object" && !Array.isArray(body) ? body : {};
}
