import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { reviseQuote } from "@/lib/quotes/quote-commands";

/** POST — a new editable revision of an accepted quote (same number); the old one is replaced. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(
    { quote: await reviseQuote(m, { id: await uuidParam(ctx, "That quote") }) },
    { status: 201 },
  );
});
