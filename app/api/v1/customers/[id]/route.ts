import { deleteCustomer, getCustomer, updateCustomer } from "@/db/queries/customers";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { CustomerPatchSchema } from "@/lib/validations/customers";

type Ctx = IdCtx;
const idOf = (ctx: Ctx) => uuidParam(ctx, "That customer");

export const GET = handle<Ctx>(async (_req, ctx) => {
  const m = await requireMember("customers:read");
  const c = await getCustomer(m.shopId, await idOf(ctx));
  if (!c) throw new NotFound("That customer");
  return Response.json({ customer: c });
});

/** PATCH — changes only the fields sent (`{ "email": "" }` clears the e-mail). */
export const PATCH = handle<Ctx>(async (req, ctx) => {
  const m = await requireMember("customers:write");
  const id = await idOf(ctx);
  const input = CustomerPatchSchema.parse(await readJson(req));
  const c = await updateCustomer(m.shopId, id, input);
  if (!c) throw new NotFound("That customer");
  return Response.json({ customer: c });
});

export const DELETE = handle<Ctx>(async (_req, ctx) => {
  const m = await requireMember("customers:write");
  if (!(await deleteCustomer(m.shopId, await idOf(ctx)))) throw new NotFound("That customer");
  return new Response(null, { status: 204 });
});
