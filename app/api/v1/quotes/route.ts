import { listQuotes } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { quoteStatusOn } from "@/lib/domain/quotes";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createQuote } from "@/lib/quotes/quote-commands";
import { shopToday } from "@/lib/shop/shop-zone";
import { QuoteCreateSchema, QuoteListQuery } from "@/lib/validations/quotes";

/**
 * GET /api/v1/quotes?q=&status=&sort= — the shop's quotes (a customer's own only), searched by
 * number, customer or build vehicle, filtered by status as of today (which each one answers).
 */
export const GET = handle(async (req) => {
  const m = await requireMember("quotes:view");
  const filters = QuoteListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  const today = await shopToday(m.shopId);
  const quotes = await listQuotes(m.shopId, {
    ...filters,
    today,
    portalUserId: ownRecordsOnly(m.role) ? m.user.id : undefined,
  });
  return Response.json({ quotes: quotes.map((q) => ({ ...q, status: quoteStatusOn(q, today) })) });
});

/**
 * POST /api/v1/quotes — a draft from a build's chosen parts ({ buildId }), or a parts-only quote
 * for a customer ({ customerId, lines?, labourHours?, notes?, validUntil? }).
 */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = QuoteCreateSchema.parse(await readJson(req));
  return Response.json({ quote: await createQuote(m, input) }, { status: 201 });
});
