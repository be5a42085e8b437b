import { getCustomerWithVehicles } from "@/db/queries/customers";
import { requireMember } from "@/lib/auth/member";
import { deleteCustomer, updateCustomer } from "@/lib/customers/customer-commands";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { CustomerPatchSchema } from "@/lib/validations/customers";

const idOf = (ctx: IdCtx) => uuidParam(ctx, "That customer");

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("customers:read");
  const c = await getCustomerWithVehicles(m.shopId, await idOf(ctx));
  if (!c) throw new NotFound("That customer");
  return Response.json({ customer: c });
});

/**
 * PATCH — changes only the fields sent (`{ "email": "" }` clears the e-mail), as the edit form
 * does; `vehicles`, when sent, is the whole list (an item with `id` changes that vehicle, one
 * without is added, one left out is removed). Answers the customer with their vehicles.
 */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await idOf(ctx);
  const input = CustomerPatchSchema.parse({ ...((await readJson(req)) as object), id });
  return Response.json({ customer: await updateCustomer(m, input) });
});

/** DELETE — 204; a customer with quotes or builds is kept: 409 `customer_in_use`. */
export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  await deleteCustomer(m, { id: await idOf(ctx) });
  return new Response(null, { status: 204 });
});
