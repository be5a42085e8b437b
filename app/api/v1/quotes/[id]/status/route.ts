import { setQuoteStatus } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { QuoteStatusSchema } from "@/lib/validations/quotes";

/** POST { status } — moves the quote along its workflow (stock held on accept, released on decline/expiry). */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("quotes:write");
  const id = await uuidParam(ctx, "That quote");
  const { status } = QuoteStatusSchema.parse(await readJson(req));
  return Response.json({ quote: await setQuoteStatus(m.shopId, id, m.user.id, status) });
});
