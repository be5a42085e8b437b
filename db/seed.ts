/**
 * Demo data: an invented shop with one member of each role and a handful of customers.
 * Idempotent — fixed ids, inserts that skip what exists. For demos and tests only: the demo
 * password must never be used in production.
 */
import { hashPassword } from "better-auth/crypto";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { DEFAULT_BSFC } from "../lib/calc/power";
import * as schema from "./schema";

export const DEMO_PASSWORD = "fuelwright-demo";
export const DEMO_SHOP_ID = "demo-shop-ridgeback";
export const DEMO_USERS = [
  { id: "demo-user-owner", role: "owner", name: "Marisol Okafor", email: "owner@demo.fuelwright.test" },
  { id: "demo-user-tuner", role: "tuner", name: "Teodor Vance", email: "tuner@demo.fuelwright.test" },
  { id: "demo-user-counter", role: "counter", name: "Priya Lindqvist", email: "counter@demo.fuelwright.test" },
  { id: "demo-user-customer", role: "customer", name: "Dashiell Moreau", email: "customer@demo.fuelwright.test" },
] as const;

const CUSTOMERS = [
  { id: "00000000-0000-4000-8000-000000000001", name: "Dashiell Moreau", email: "customer@demo.fuelwright.test", phone: "555-0142", notes: "Turbo six, flex fuel. Wants 500 whp on pump E85.", userId: "demo-user-customer" },
  { id: "00000000-0000-4000-8000-000000000002", name: "Harriet Quill", email: "harriet.quill@example.test", phone: "555-0177", notes: "NA four-cylinder track car." },
  { id: "00000000-0000-4000-8000-000000000003", name: "Bo Castellanos", email: "bo.castellanos@example.test", phone: "555-0103", notes: "Supercharged V8, twin pumps planned." },
  { id: "00000000-0000-4000-8000-000000000004", name: "Ingrid Achterberg", email: null, phone: "555-0199", notes: null },
  { id: "00000000-0000-4000-8000-000000000005", name: "Kwame Ostrowski", email: "kwame.o@example.test", phone: null, notes: "Drag car, methanol later?" },
];

export async function seed(url: string) {
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  const db = drizzle(sql, { schema });
  try {
    const hash = await hashPassword(DEMO_PASSWORD);
    await db.transaction(async (tx) => {
      await tx.insert(schema.organization).values({ id: DEMO_SHOP_ID, name: "Ridgeback Fuel & Dyno", slug: "ridgeback-fuel-dyno" }).onConflictDoNothing();
      await tx
        .insert(schema.shopSettings)
        .values({
          shopId: DEMO_SHOP_ID,
          currency: "USD",
          taxRateBp: 825,
          units: "imperial",
          address: "14 Foundry Lane, Millbrook",
          phone: "555-0100",
          bsfcGasolineNa: DEFAULT_BSFC.gasolineNaGPerKwh,
          bsfcGasolineBoosted: DEFAULT_BSFC.gasolineBoostedGPerKwh,
          bsfcE85Na: DEFAULT_BSFC.e85NaGPerKwh,
          bsfcE85Boosted: DEFAULT_BSFC.e85BoostedGPerKwh,
        })
        .onConflictDoNothing();
      for (const u of DEMO_USERS) {
        await tx.insert(schema.user).values({ id: u.id, name: u.name, email: u.email, emailVerified: true }).onConflictDoNothing();
        await tx.insert(schema.account).values({ id: `${u.id}-credential`, accountId: u.id, providerId: "credential", userId: u.id, password: hash }).onConflictDoNothing();
        await tx.insert(schema.member).values({ id: `${u.id}-member`, organizationId: DEMO_SHOP_ID, userId: u.id, role: u.role }).onConflictDoNothing();
      }
      for (const c of CUSTOMERS) await tx.insert(schema.customers).values({ ...c, shopId: DEMO_SHOP_ID }).onConflictDoNothing();
    });
  } finally {
    await sql.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(1);
  }
  await seed(url);
  console.log("seed: demo shop ready (demo password — never use in production)");
}
