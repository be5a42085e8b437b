import { listQuotes } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { quoteFromBuild } from "@/lib/catalog/quote-service";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { QuoteCreateSchema } from "@/lib/validations/quotes";

/** GET /api/v1/quotes — the shop's quotes (a customer's own only). */
export const GET = handle(async () => {
  const m = await requireMember("quotes:view");
  return Response.json({
    quotes: await listQuotes(m.shopId, {
      portalUserId: ownRecordsOnly(m.role) ? m.user.id : undefined,
    }),
  });
});

/** POST /api/v1/quotes — a draft from a build's chosen parts ({ buildId }) or for a customer. */
export const POST = handle(async (req) => {
  const m = await requireMember("quotes:write");
  const body = QuoteCreateSchema.parse(await readJson(req));
  return Response.json({ quote: await quoteFromBuild(m.shopId, m.user.id, body) }, { status: 201 });
});
