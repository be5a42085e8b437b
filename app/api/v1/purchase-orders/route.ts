import { listPurchaseOrders } from "@/db/queries/purchasing";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createPurchaseOrder } from "@/lib/purchasing/purchasing-commands";
import { PurchaseOrderCreateSchema } from "@/lib/validations/operations";

/** GET — the shop's purchase orders, newest first (staff only). */
export const GET = handle(async () => {
  const m = await requireMember("purchasing:read");
  const rows = await listPurchaseOrders(m.shopId);
  return Response.json({
    purchaseOrders: rows.map((r) => ({ ...r.po, supplierName: r.supplierName })),
  });
});

/** POST { supplierId, lines: [{ partId, quantity, unitCostMinor? }], notes? } — a draft order. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = PurchaseOrderCreateSchema.parse(await readJson(req));
  return Response.json({ purchaseOrder: await createPurchaseOrder(m, input) }, { status: 201 });
});
