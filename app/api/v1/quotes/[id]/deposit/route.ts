import { z } from "zod";

import { requireMember } from "@/lib/auth/member";
import { serverEnv } from "@/lib/env";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { confirmReturn, startDeposit } from "@/lib/payments/service";

const Return = z.object({
  session: z
    .string({ error: "session is required" })
    .regex(/^cs_[A-Za-z0-9_]{4,200}$/, "session is not a checkout session id"),
});

/** POST — the customer starts paying the deposit on their own accepted quote: { url } of the checkout. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:pay");
  const id = await uuidParam(ctx, "That quote");
  return Response.json(await startDeposit(m.shopId, m.user.id, id));
});

/** GET ?session=cs_… — where the checkout sends the customer back: confirm, then show the quote. */
export const GET = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("quotes:pay");
  const id = await uuidParam(ctx, "That quote");
  const { session } = Return.parse(Object.fromEntries(new URL(req.url).searchParams));
  const outcome = await confirmReturn(m.shopId, m.user.id, id, session);
  return Response.redirect(
    new URL(
      `/my/quotes/${id}?payment=${outcome === "unpaid" ? "pending" : "paid"}`,
      serverEnv().APP_URL,
    ),
    303,
  );
});
