import { and, asc, count, eq, ilike, or, sql } from "drizzle-orm";

import { db } from "@/db";
import { builds, customers, quotes, type Customer } from "@/db/schema";
import { Conflict, NotFound } from "@/lib/domain/errors";
import type { CustomerInput } from "@/lib/validations/customers";

import { escapeLike } from "./like";
import { differs } from "./unchanged";

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

/**
 * Sets the fields given (an absent or `undefined` one keeps its value), within the shop only.
 * With `expectedVersion`, only if the record is still at it; else Conflict carrying the record as
 * it is now. Fields that already hold the values given are not written: the row stays exactly
 * as it was (no new version, no new `updated_at`) and comes back as it is.
 */
export async function updateCustomer(
  shopId: string,
  id: string,
  input: Partial<CustomerInput>,
  expectedVersion?: number,
) {
  const given = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  const mine = and(eq(customers.shopId, shopId), eq(customers.id, id));
  const [row] = await db
    .update(customers)
    .set({ ...given, version: sql`${customers.version} + 1`, updatedAt: new Date() })
    .where(
      and(
        mine,
        expectedVersion === undefined ? undefined : eq(customers.version, expectedVersion),
        differs(customers, given),
      ),
    )
    .returning();
  if (row) return row;
  const [current] = await db.select().from(customers).where(mine).limit(1);
  if (!current) throw new NotFound("That customer");
  if (expectedVersion !== undefined && current.version !== expectedVersion)
    throw new Conflict<Customer>(
      `Someone saved this customer meanwhile (now version ${current.version}); nothing was overwritten`,
      "conflict",
      current,
    );
  return current;
}

/** Is this (or what it wraps) a foreign-key violation: a row elsewhere still points here? */
function isForeignKeyViolation(err: unknown): boolean {
  for (let e = err, depth = 0; e && typeof e === "object" && depth < 5; depth++) {
    if ((e as { code?: unknown }).code === "23503") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/**
 * Deletes a customer who has no quotes and no builds, in one transaction (the row locked, so no
 * quote or build can name them meanwhile). One who has any is kept, and their counts returned.
 */
export async function deleteCustomerIfUnused(shopId: string, id: string) {
  try {
    return await db.transaction(async (tx) => {
      const [c] = await tx
        .select({ id: customers.id, name: customers.name })
        .from(customers)
        .where(and(eq(customers.shopId, shopId), eq(customers.id, id)))
        .for("update")
        .limit(1);
      if (!c) throw new NotFound("That customer");
      const [q] = await tx
        .select({ n: count() })
        .from(quotes)
        .where(and(eq(quotes.shopId, shopId), eq(quotes.customerId, id)));
      const [b] = await tx
        .select({ n: count() })
        .from(builds)
        .where(and(eq(builds.shopId, shopId), eq(builds.customerId, id)));
      const usage = { name: c.name, quotes: q?.n ?? 0, builds: b?.n ?? 0 };
      if (usage.quotes > 0 || usage.builds > 0) return { deleted: false as const, ...usage };
      await tx.delete(customers).where(and(eq(customers.shopId, shopId), eq(customers.id, id)));
      return { deleted: true as const, ...usage };
    });
  } catch (e) {
    if (isForeignKeyViolation(e))
      throw new Conflict(
        "This customer is named on other records, so they are kept",
        "customer_in_use",
      );
    throw e;
  }
}
