import { listCustomers } from "@/db/queries/customers";
import { requireMember } from "@/lib/auth/member";
import { createCustomer } from "@/lib/customers/customer-commands";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { CustomerCreateSchema, CustomerListQuery } from "@/lib/validations/customers";

/**
 * GET /api/v1/customers?q=&limit= — the shop's customers with their `vehicles`; `q` searches
 * name, e-mail, phone (however typed) and vehicle (year, make, model, engine, VIN).
 */
export const GET = handle(async (req) => {
  const m = await requireMember("customers:read");
  const q = CustomerListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ customers: await listCustomers(m.shopId, q) });
});

/** POST /api/v1/customers — a customer, optionally with `vehicles`; 201 with them. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = CustomerCreateSchema.parse(await readJson(req));
  return Response.json({ customer: await createCustomer(m, input) }, { status: 201 });
});
