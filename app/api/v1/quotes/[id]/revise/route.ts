import { reviseQuote } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** POST — a new editable revision of an accepted quote (same number); the old one is replaced. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:write");
  return Response.json(
    { quote: await reviseQuote(m.shopId, await uuidParam(ctx, "That quote"), m.user.id) },
    { status: 201 },
  );
});
