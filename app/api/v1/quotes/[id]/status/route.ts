import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { changeQuoteStatus } from "@/lib/quotes/quote-commands";
import { QuoteStatusSchema } from "@/lib/validations/quotes";

/** POST { status } — moves the quote along its workflow (stock held on accept, released on decline/expiry). */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That quote");
  const body = await readJson(req);
  const input = QuoteStatusSchema.parse({
    status: (body as { status?: unknown } | null)?.status,
    id,
  });
  return Response.json({ quote: await changeQuoteStatus(m, input) });
});
