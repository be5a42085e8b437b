import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { cancelPurchaseOrder } from "@/lib/purchasing/purchasing-commands";
import { PurchaseOrderCancelSchema } from "@/lib/validations/operations";

/**
 * POST { version } — cancels an order nothing was received against (422 `not_cancellable`
 * otherwise; a stale version is a 409); its back-orders are on the reorder list again.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That purchase order");
  const body = await readJson(req);
  const input = PurchaseOrderCancelSchema.parse({
    version: (body as { version?: unknown } | null)?.version,
    id,
  });
  return Response.json({ purchaseOrder: await cancelPurchaseOrder(m, input) });
});
