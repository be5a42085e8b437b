import { getPurchaseOrder } from "@/db/queries/purchasing";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** GET — the purchase order with its lines (ordered and received). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("purchasing:read");
  const po = await getPurchaseOrder(m.shopId, await uuidParam(ctx, "That purchase order"));
  if (!po) throw new NotFound("That purchase order");
  return Response.json({ purchaseOrder: po });
});
