import { requireMember } from "@/lib/auth/member";
import { serverEnv } from "@/lib/env";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { confirmDepositReturn, startDeposit } from "@/lib/payments/payment-commands";
import { DepositReturnSchema } from "@/lib/validations/quotes";

/** POST — the customer starts paying the deposit on their own accepted quote: { url } of the checkout. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(await startDeposit(m, { id: await uuidParam(ctx, "That quote") }));
});

/** GET ?session=cs_… — where the checkout sends the customer back: confirm, then show the quote. */
export const GET = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That quote");
  const input = DepositReturnSchema.parse({
    session: new URL(req.url).searchParams.get("session") ?? undefined,
    id,
  });
  const outcome = await confirmDepositReturn(m, input);
  return Response.redirect(
    new URL(
      `/my/quotes/${id}?payment=${outcome === "unpaid" ? "pending" : "paid"}`,
      serverEnv().APP_URL,
    ),
    303,
  );
});
