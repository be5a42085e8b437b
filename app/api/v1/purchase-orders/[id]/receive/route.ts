import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { receivePurchaseOrder } from "@/lib/purchasing/purchasing-commands";
import { PurchaseOrderReceiveSchema } from "@/lib/validations/operations";

/**
 * POST { lines: [{ lineId, quantity }] } — receives stock against the order, in part or in full;
 * back-orders are given it in the order their quotes were accepted (`released`).
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That purchase order");
  const body = await readJson(req);
  const input = PurchaseOrderReceiveSchema.parse({
    lines: (body as { lines?: unknown } | null)?.lines,
    id,
  });
  return Response.json(await receivePurchaseOrder(m, input));
});
