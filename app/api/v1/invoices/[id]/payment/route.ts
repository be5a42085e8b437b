import { requireMember } from "@/lib/auth/member";
import { serverEnv } from "@/lib/env";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { confirmBalanceReturn, startBalancePayment } from "@/lib/invoices/invoice-commands";
import { BalanceReturnSchema } from "@/lib/validations/operations";

/** POST — the customer starts paying the balance of their own issued invoice: { url, amountMinor }. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(await startBalancePayment(m, { id: await uuidParam(ctx, "That invoice") }));
});

/** GET ?session=cs_… — where the checkout sends the customer back: confirm, then show the invoice. */
export const GET = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That invoice");
  const input = BalanceReturnSchema.parse({
    session: new URL(req.url).searchParams.get("session") ?? undefined,
    id,
  });
  const outcome = await confirmBalanceReturn(m, input);
  return Response.redirect(
    new URL(
      `/my/invoices/${id}?payment=${outcome === "unpaid" ? "pending" : "paid"}`,
      serverEnv().APP_URL,
    ),
    303,
  );
});
