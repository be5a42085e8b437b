import { getSupplier } from "@/db/queries/purchasing";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { deleteSupplier, updateSupplier } from "@/lib/purchasing/purchasing-commands";
import { SupplierUpdateSchema } from "@/lib/validations/operations";

/** GET — the supplier with their SKUs for our parts. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("purchasing:read");
  const s = await getSupplier(m.shopId, await uuidParam(ctx, "That supplier"));
  if (!s) throw new NotFound("That supplier");
  return Response.json({ supplier: s });
});

/** PATCH — any of the supplier's fields (`parts`: the whole list); `version` optional. */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That supplier");
  const body = await readJson(req);
  const input = SupplierUpdateSchema.parse({
    ...(body && typeof body === "object" ? body : {}),
    id,
  });
  return Response.json({ supplier: await updateSupplier(m, input) });
});

/** DELETE — a supplier with no purchase orders. */
export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(await deleteSupplier(m, { id: await uuidParam(ctx, "That supplier") }));
});
