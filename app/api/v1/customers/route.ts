import { listCustomers } from "@/db/queries/customers";
import { requireMember } from "@/lib/auth/member";
import { createCustomer } from "@/lib/customers/customer-commands";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { CustomerListQuery, CustomerSchema } from "@/lib/validations/customers";

export const GET = handle(async (req) => {
  const m = await requireMember("customers:read");
  const q = CustomerListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ customers: await listCustomers(m.shopId, q) });
});

export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = CustomerSchema.parse(await readJson(req));
  return Response.json({ customer: await createCustomer(m, input) }, { status: 201 });
});
