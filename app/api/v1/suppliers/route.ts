import { listSuppliers } from "@/db/queries/purchasing";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createSupplier } from "@/lib/purchasing/purchasing-commands";
import { SupplierCreateSchema } from "@/lib/validations/operations";

/** GET — the shop's suppliers (staff only). */
export const GET = handle(async () => {
  const m = await requireMember("purchasing:read");
  return Response.json({ suppliers: await listSuppliers(m.shopId) });
});

/** POST { name, contactName?, email?, phone?, leadTimeDays?, notes?, parts? } — a new supplier. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = SupplierCreateSchema.parse(await readJson(req));
  return Response.json({ supplier: await createSupplier(m, input) }, { status: 201 });
});
