import { and, asc, count, desc, eq, ilike, or, sql, type SQL } from "drizzle-orm";

import { db } from "@/db";
import {
  builds,
  customers,
  payments,
  quotes,
  shopSettings,
  vehicles,
  type Customer,
  type Vehicle,
} from "@/db/schema";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { phoneSearchDigits } from "@/lib/format/phone";
import type { CustomerInput } from "@/lib/validations/customers";
import type { VehicleInput, VehicleListItem } from "@/lib/validations/vehicles";

import { escapeLike } from "./like";
import { differs } from "./unchanged";
import { deleteVehicle, insertVehicle, listVehicles, patchVehicle, vehiclesOf } from "./vehicles";

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** A customer with their vehicles: what the API answers and the customer page shows. */
export type CustomerWithVehicles = Customer & { vehicles: Vehicle[] };

/** The shop's country (ISO 3166-1 alpha-2): phone numbers without `+` are read as from there. */
export async function shopCountry(shopId: string): Promise<string> {
  const [row] = await db
    .select({ country: shopSettings.country })
    .from(shopSettings)
    .where(eq(shopSettings.shopId, shopId))
    .limit(1);
  return row?.country ?? "US";
}

/**
 * What a search for `q` matches: every word in the name, e-mail, phone or one of the customer's
 * vehicles (year, make, model, engine, VIN) — or, when `q` reads as a phone number, the
 * customer's number whatever its spelling (digits compared, lib/format/phone#phoneSearchDigits).
 */
function customerSearch(shopId: string, q: string, country: string): SQL | undefined {
  const words = q.split(/\s+/).filter(Boolean).slice(0, 8);
  const vehicleText = sql`concat_ws(' ', ${vehicles.year}, ${vehicles.make}, ${vehicles.model}, ${vehicles.engine}, ${vehicles.vin})`;
  const byWord = words.map((w) => {
    const p = `%${escapeLike(w)}%`;
    return or(
      ilike(customers.name, p),
      ilike(customers.email, p),
      ilike(customers.phone, p),
      sql`exists (select 1 from ${vehicles} where ${vehicles.shopId} = ${shopId} and ${vehicles.customerId} = ${customers.id} and ${vehicleText} ilike ${p})`,
    )!;
  });
  const byPhone = phoneSearchDigits(q, country).map(
    (d) =>
      sql`regexp_replace(coalesce(${customers.phone}, ''), '[^0-9]', '', 'g') like ${`%${d}%`}`,
  );
  return or(and(...byWord), ...byPhone);
}

/**
 * A shop's customers by name, each with their vehicles, optionally searched (customerSearch).
 */
export async function listCustomers(
  shopId: string,
  opts: { q?: string; limit?: number } = {},
): Promise<CustomerWithVehicles[]> {
  const q = opts.q?.trim();
  const search = q ? customerSearch(shopId, q, await shopCountry(shopId)) : undefined;
  const rows = await db
    .select()
    .from(customers)
    .where(and(eq(customers.shopId, shopId), search))
    .orderBy(asc(customers.name), asc(customers.id))
    .limit(opts.limit ?? 50);
  const byCustomer = await vehiclesOf(
    shopId,
    rows.map((r) => r.id),
  );
  return rows.map((c) => ({ ...c, vehicles: byCustomer.get(c.id) ?? [] }));
}

export async function getCustomer(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(customers)
    .where(and(eq(customers.shopId, shopId), eq(customers.id, id)))
    .limit(1);
  return row ?? null;
}

/** One of the shop's customers with their vehicles, or null. */
export async function getCustomerWithVehicles(
  shopId: string,
  id: string,
): Promise<CustomerWithVehicles | null> {
  const c = await getCustomer(shopId, id);
  return c ? { ...c, vehicles: await listVehicles(shopId, id) } : null;
}

/** A new customer, with their vehicles, in one transaction. */
export async function createCustomer(
  shopId: string,
  input: CustomerInput,
  vehicleList: VehicleInput[] = [],
): Promise<CustomerWithVehicles> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(customers)
      .values({ shopId, ...input })
      .returning();
    const made: Vehicle[] = [];
    for (const v of vehicleList) made.push(await insertVehicle(shopId, row!.id, v, tx));
    return { ...row!, vehicles: made };
  });
}

/**
 * Makes the customer's vehicles the list given: an item with an id changes that vehicle (only
 * the fields sent, only if they differ), one without is added, a stored one left out is removed.
 * An id that is not one of this customer's vehicles is NotFound.
 */
async function syncVehicles(shopId: string, customerId: string, list: VehicleListItem[], tx: Tx) {
  const stored = await listVehicles(shopId, customerId, tx);
  const kept = new Set(list.flatMap((v) => (v.id ? [v.id] : [])));
  for (const v of stored) if (!kept.has(v.id)) await deleteVehicle(shopId, v.id, tx);
  for (const { id, ...fields } of list) {
    if (id) await patchVehicle(shopId, id, fields, { customerId, tx });
    else await insertVehicle(shopId, customerId, fields as VehicleInput, tx);
  }
}

/**
 * Sets the fields given (an absent or `undefined` one keeps its value), within the shop only,
 * and with `vehicles` the customer's whole vehicle list (syncVehicles), in one transaction.
 * With `expectedVersion`, only if the record is still at it; else Conflict carrying the record as
 * it is now. Fields that already hold the values given are not written: the row stays exactly
 * as it was (no new version, no new `updated_at`) and comes back as it is.
 */
export async function updateCustomer(
  shopId: string,
  id: string,
  input: Partial<CustomerInput>,
  expectedVersion?: number,
  vehicleList?: VehicleListItem[],
): Promise<CustomerWithVehicles> {
  const given = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  const mine = and(eq(customers.shopId, shopId), eq(customers.id, id));
  return db.transaction(async (tx) => {
    const [current] = await tx.select().from(customers).where(mine).for("update").limit(1);
    if (!current) throw new NotFound("That customer");
    if (expectedVersion !== undefined && current.version !== expectedVersion)
      throw new Conflict<CustomerWithVehicles>(
        `Someone saved this customer meanwhile (now version ${current.version}); nothing was overwritten`,
        "conflict",
        { ...current, vehicles: await listVehicles(shopId, id, tx) },
      );
    const [row] = Object.keys(given).length
      ? await tx
          .update(customers)
          .set({ ...given, version: sql`${customers.version} + 1`, updatedAt: new Date() })
          .where(and(mine, differs(customers, given)))
          .returning()
      : [];
    if (vehicleList) await syncVehicles(shopId, id, vehicleList, tx);
    return { ...(row ?? current), vehicles: await listVehicles(shopId, id, tx) };
  });
}

/** A customer's quotes (every revision but the superseded), newest first. */
export async function customerQuotes(shopId: string, customerId: string) {
  return db
    .select({
      id: quotes.id,
      number: quotes.number,
      revision: quotes.revision,
      status: quotes.status,
      totalMinor: quotes.totalMinor,
      currency: quotes.currency,
      validUntil: quotes.validUntil,
      buildTitle: builds.title,
    })
    .from(quotes)
    .leftJoin(builds, eq(builds.id, quotes.buildId))
    .where(
      and(
        eq(quotes.shopId, shopId),
        eq(quotes.customerId, customerId),
        sql`${quotes.status} <> 'superseded'`,
      ),
    )
    .orderBy(desc(quotes.number), desc(quotes.revision))
    .limit(200);
}

/** Payments on a customer's quotes, newest first. */
export async function customerPayments(shopId: string, customerId: string) {
  return db
    .select({
      id: payments.id,
      quoteId: payments.quoteId,
      number: quotes.number,
      revision: quotes.revision,
      amountMinor: payments.amountMinor,
      currency: payments.currency,
      status: payments.status,
      paidAt: payments.paidAt,
      createdAt: payments.createdAt,
    })
    .from(payments)
    .innerJoin(quotes, eq(quotes.id, payments.quoteId))
    .where(and(eq(payments.shopId, shopId), eq(quotes.customerId, customerId)))
    .orderBy(desc(payments.createdAt))
    .limit(200);
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
