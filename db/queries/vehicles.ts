import { and, asc, eq, inArray } from "drizzle-orm";

import { db } from "@/db";
import { customers, vehicles, type Vehicle } from "@/db/schema";
import { NotFound } from "@/lib/domain/errors";
import type { VehicleInput } from "@/lib/validations/vehicles";

import { differs } from "./unchanged";

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
type Q = Tx | typeof db;

/** A customer's vehicles, newest model year first. */
export async function listVehicles(shopId: string, customerId: string, q: Q = db) {
  return q
    .select()
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.customerId, customerId)))
    .orderBy(asc(vehicles.createdAt), asc(vehicles.id));
}

/** The vehicles of several customers, by customer id. */
export async function vehiclesOf(shopId: string, customerIds: string[]) {
  const out = new Map<string, Vehicle[]>();
  if (customerIds.length === 0) return out;
  const rows = await db
    .select()
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), inArray(vehicles.customerId, customerIds)))
    .orderBy(asc(vehicles.createdAt), asc(vehicles.id));
  for (const v of rows) out.set(v.customerId, [...(out.get(v.customerId) ?? []), v]);
  return out;
}

export async function getVehicle(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, id)))
    .limit(1);
  return row ?? null;
}

/** Adds a vehicle to one of the shop's customers (NotFound when the customer is not the shop's). */
export async function insertVehicle(
  shopId: string,
  customerId: string,
  v: VehicleInput,
  tx?: Tx,
): Promise<Vehicle> {
  const run = async (q: Tx) => {
    const [c] = await q
      .select({ id: customers.id })
      .from(customers)
      .where(and(eq(customers.shopId, shopId), eq(customers.id, customerId)))
      .for("share")
      .limit(1);
    if (!c) throw new NotFound("That customer");
    const [row] = await q
      .insert(vehicles)
      .values({ shopId, customerId, ...v })
      .returning();
    return row!;
  };
  return tx ? run(tx) : db.transaction(run);
}

/**
 * Sets the fields given on one of the shop's vehicles; values equal to the stored ones write
 * nothing (the row comes back as it is). NotFound when it is not the shop's (or, with
 * `customerId`, not that customer's).
 */
export async function patchVehicle(
  shopId: string,
  id: string,
  input: Partial<VehicleInput>,
  opts: { customerId?: string; tx?: Tx } = {},
): Promise<Vehicle> {
  const q = opts.tx ?? db;
  const given = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  const mine = and(
    eq(vehicles.shopId, shopId),
    eq(vehicles.id, id),
    opts.customerId ? eq(vehicles.customerId, opts.customerId) : undefined,
  );
  const [row] = Object.keys(given).length
    ? await q
        .update(vehicles)
        .set({ ...given, updatedAt: new Date() })
        .where(and(mine, differs(vehicles, given)))
        .returning()
    : [];
  if (row) return row;
  const [current] = await q.select().from(vehicles).where(mine).limit(1);
  if (!current) throw new NotFound("That vehicle");
  return current;
}

/** Removes one of the shop's vehicles (builds that named it keep their vehicle text). */
export async function deleteVehicle(shopId: string, id: string, tx?: Tx): Promise<Vehicle> {
  const [row] = await (tx ?? db)
    .delete(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, id)))
    .returning();
  if (!row) throw new NotFound("That vehicle");
  return row;
}
