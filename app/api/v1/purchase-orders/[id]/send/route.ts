import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { sendPurchaseOrder } from "@/lib/purchasing/purchasing-commands";

/** POST — e-mails a draft order to its supplier (with its PDF); sent once the mail server took it. */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That purchase order");
  return Response.json({ purchaseOrder: await sendPurchaseOrder(m, { id }) });
});
