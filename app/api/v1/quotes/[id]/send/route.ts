import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { sendQuote } from "@/lib/quotes/quote-commands";

/** POST — e-mails the quote to the customer; logged on the quote; a failed send changes nothing. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(await sendQuote(m, { id: await uuidParam(ctx, "That quote") }));
});
