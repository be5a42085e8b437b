import { listQuotes } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { isoDay, quoteStatusOn } from "@/lib/domain/quotes";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createQuote } from "@/lib/quotes/quote-commands";
import { QuoteCreateSchema } from "@/lib/validations/quotes";

/** GET /api/v1/quotes — the shop's quotes (a customer's own only), status as of today. */
export const GET = handle(async () => {
  const m = await requireMember("quotes:view");
  const today = isoDay();
  const quotes = await listQuotes(m.shopId, {
    portalUserId: ownRecordsOnly(m.role) ? m.user.id : undefined,
  });
  return Response.json({ quotes: quotes.map((q) => ({ ...q, status: quoteStatusOn(q, today) })) });
});

/** POST /api/v1/quotes — a draft from a build's chosen parts ({ buildId }) or for a customer. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = QuoteCreateSchema.parse(await readJson(req));
  return Response.json({ quote: await createQuote(m, input) }, { status: 201 });
});
