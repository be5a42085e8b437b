import { and, asc, eq, ilike, or } from "drizzle-orm";

import { db } from "@/db";
import { customers } from "@/db/schema";
import type { CustomerInput } from "@/lib/validations/customers";

import { escapeLike } from "./like";

/** A shop's customers, optionally searched by name, e-mail or phone. */
export async function listCustomers(shopId: string, opts: { q?: string; limit?: number } = {}) {
  const q = opts.q?.trim();
  const search = q
    ? or(
        ilike(customers.name, `%${escapeLike(q)}%`),
        ilike(customers.email, `%${escapeLike(q)}%`),
        ilike(customers.phone, `%${escapeLike(q)}%`),
      )
    : undefined;
  return db
    .select()
    .from(customers)
    .where(search ? and(eq(customers.shopId, shopId), search) : eq(customers.shopId, shopId))
    .orderBy(asc(customers.name))
    .limit(opts.limit ?? 50);
}

export async function getCustomer(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(customers)
    .where(and(eq(customers.shopId, shopId), eq(customers.id, id)))
    .limit(1);
  return row ?? null;
}

export async function createCustomer(shopId: string, input: CustomerInput) {
  const [row] = await db
    .insert(customers)
    .values({ shopId, ...input })
    .returning();
  return row!;
}

/** Sets the fields given (an absent, `undefined` one is left as it is), only within the shop; null when the customer is not the shop's. */
export async function updateCustomer(shopId: string, id: string, input: Partial<CustomerInput>) {
  const [row] = await db
    .update(customers)
    .set({ ...input, updatedAt: new Date() })
    .where(and(eq(customers.shopId, shopId), eq(customers.id, id)))
    .returning();
  return row ?? null;
}

export async function deleteCustomer(shopId: string, id: string) {
  const rows = await db
    .delete(customers)
    .where(and(eq(customers.shopId, shopId), eq(customers.id, id)))
    .returning({ id: customers.id });
  return rows.length > 0;
}
