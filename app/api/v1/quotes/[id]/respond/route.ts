import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { respondToQuote } from "@/lib/quotes/quote-commands";
import { QuoteResponseSchema } from "@/lib/validations/quotes";

/** POST { decision } — the customer accepts or declines their own sent quote (time and who are recorded). */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That quote");
  const body = await readJson(req);
  const input = QuoteResponseSchema.parse({
    decision: (body as { decision?: unknown } | null)?.decision,
    id,
  });
  return Response.json({ quote: await respondToQuote(m, input) });
});
