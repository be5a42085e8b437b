import { requireMember } from "@/lib/auth/member";
import { sendQuote } from "@/lib/catalog/quote-service";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** POST — e-mails the quote to the customer; logged on the quote; a failed send changes nothing. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:write");
  return Response.json(
    await sendQuote(m.shopId, m.shopName, m.user.id, await uuidParam(ctx, "That quote")),
  );
});
