/**
 * Demo data: an invented shop with one member of each role and a handful of customers.
 * Idempotent — fixed ids, inserts that skip what exists. For demos and tests only: the demo
 * password must never be used in production.
 */
import { hashPassword } from "better-auth/crypto";
import { sql as dsql, eq } from "drizzle-orm";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";

import { INPUTS_SCHEMA_VERSION } from "../lib/builds/stored-inputs";
import {
  CALC_VERSION,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  type FuelSystemInput,
} from "../lib/calc";
import { DEFAULT_BSFC } from "../lib/calc/power";
import { quoteTotals } from "../lib/catalog/quote-totals";
import type { BuildStatus } from "../lib/domain/builds";
import { parsedEffectiveInputs, sizingSettingsOf } from "../lib/sizing/effective-inputs";
import * as schema from "./schema";
import { DEMO_PARTS } from "./seed-catalog";

export const DEMO_PASSWORD = "fuelwright-demo";
export const DEMO_SHOP_ID = "demo-shop-ridgeback";
export const DEMO_USERS = [
  {
    id: "demo-user-owner",
    role: "owner",
    name: "Marisol Okafor",
    email: "owner@demo.fuelwright.test",
  },
  {
    id: "demo-user-tuner",
    role: "tuner",
    name: "Teodor Vance",
    email: "tuner@demo.fuelwright.test",
  },
  {
    id: "demo-user-counter",
    role: "counter",
    name: "Priya Lindqvist",
    email: "counter@demo.fuelwright.test",
  },
  {
    id: "demo-user-customer",
    role: "customer",
    name: "Dashiell Moreau",
    email: "customer@demo.fuelwright.test",
  },
] as const;

const CUSTOMERS = [
  {
    id: "00000000-0000-4000-8000-000000000001",
    name: "Dashiell Moreau",
    email: "customer@demo.fuelwright.test",
    phone: "+12015550142",
    notes: "Turbo six, flex fuel. Wants 500 whp on pump E85.",
    userId: "demo-user-customer",
    addressLine1: "88 Kestrel Row",
    city: "Millbrook",
    region: "NJ",
    postcode: "07999",
  },
  {
    id: "00000000-0000-4000-8000-000000000002",
    name: "Harriet Quill",
    email: "harriet.quill@example.test",
    phone: "+12015550177",
    notes: "NA four-cylinder track car.",
    addressLine1: "3 Tannery Court",
    addressLine2: "Unit 2",
    city: "Millbrook",
    region: "NJ",
    postcode: "07999",
  },
  {
    id: "00000000-0000-4000-8000-000000000003",
    name: "Bo Castellanos",
    email: "bo.castellanos@example.test",
    phone: "+12015550103",
    notes: "Supercharged V8, twin pumps planned.",
    addressLine1: "1200 Quarry Road",
    city: "Alder Falls",
    region: "NJ",
    postcode: "07998",
  },
  {
    id: "00000000-0000-4000-8000-000000000004",
    name: "Ingrid Achterberg",
    email: null,
    phone: "+12015550188",
    notes: null,
    addressLine1: "41 Weir Street",
    city: "Alder Falls",
    region: "NJ",
    postcode: "07998",
  },
  {
    id: "00000000-0000-4000-8000-000000000005",
    name: "Kwame Ostrowski",
    email: "kwame.o@example.test",
    phone: null,
    notes: "Drag car, methanol later?",
  },
];

/** Invented vehicles of the demo customers (makes and models are made up). */
export const DEMO_VEHICLES = [
  {
    id: "20000000-0000-4000-8000-000000000001",
    customerId: CUSTOMERS[1]!.id,
    year: 2009,
    make: "Harlan",
    model: "Vesta",
    engine: "2.0 NA four",
    notes: "Track car; caged.",
  },
  {
    id: "20000000-0000-4000-8000-000000000002",
    customerId: CUSTOMERS[0]!.id,
    year: 2016,
    make: "Corvane",
    model: "RX6",
    engine: "3.0 turbo inline-six",
    notes: null,
  },
  {
    id: "20000000-0000-4000-8000-000000000003",
    customerId: CUSTOMERS[2]!.id,
    year: 2012,
    make: "Brennan",
    model: "Stag",
    engine: "5.0 twin-turbo V8",
    notes: null,
  },
  {
    id: "20000000-0000-4000-8000-000000000004",
    customerId: CUSTOMERS[4]!.id,
    year: 2007,
    make: "Ostrander",
    model: "GT",
    engine: "3.5 supercharged V6",
    notes: "Drag car.",
  },
  {
    id: "20000000-0000-4000-8000-000000000005",
    customerId: CUSTOMERS[3]!.id,
    year: 1998,
    make: "Tamsin",
    model: "Coupe 2.2",
    engine: "2.2 turbo four",
    notes: "Caller wants pump E85.",
  },
] as const;

const pump = (quantity: number, scale = 1) => ({
  label: "Ridgeline RP-340 (demo curve)",
  quantity,
  curves: [
    {
      voltage: 12,
      points: [
        { pressureKpa: 300, flowLPerH: 300 * scale },
        { pressureKpa: 500, flowLPerH: 250 * scale },
        { pressureKpa: 700, flowLPerH: 190 * scale },
      ],
    },
    {
      voltage: 13.5,
      points: [
        { pressureKpa: 300, flowLPerH: 340 * scale },
        { pressureKpa: 500, flowLPerH: 290 * scale },
        { pressureKpa: 700, flowLPerH: 230 * scale },
      ],
    },
  ],
});

/**
 * Invented demo builds across the statuses, each consistent with the status rules of
 * lib/domain/builds.ts (checked by tests/unit/seed-consistency.test.ts): the quoted one has a
 * sent quote, the fitted one an accepted quote; none is verified, as none has a dyno log.
 */
export const DEMO_BUILDS: {
  id: string;
  customerId: string;
  title: string;
  vehicle: string;
  vehicleId: string;
  status: BuildStatus;
  inputs: FuelSystemInput;
  /** Who took it: the counter's draft from a caller's goal has no tuner yet. */
  by?: "counter";
}[] = [
  {
    id: "10000000-0000-4000-8000-000000000001",
    customerId: CUSTOMERS[1]!.id,
    title: "Track day on pump gas",
    vehicle: "2009 Harlan Vesta (2.0 NA four)",
    vehicleId: DEMO_VEHICLES[0].id,
    status: "fitted",
    inputs: {
      engine: {
        cylinders: 4,
        displacementL: 2.0,
        aspiration: "na",
        redlineRpm: 7800,
        idleRpm: 900,
        maxBoostKpa: 0,
      },
      target: { powerKw: 160, measuredAt: "crank", drivetrainLossPct: 12 },
      fuel: { ethanolMinVolPct: 0, ethanolMaxVolPct: 10 },
      injectors: { count: 4, ratedFlowCcPerMin: 440, ratedPressureKpa: 300, minPulseWidthMs: 0.6 },
      regulator: { type: "fixed", basePressureKpa: 350 },
      pumps: [pump(1, 0.6)],
      electrical: { voltageAtPump: 13.5 },
    },
  },
  {
    id: "10000000-0000-4000-8000-000000000002",
    customerId: CUSTOMERS[0]!.id,
    title: "500 whp on pump E85",
    vehicle: "2016 Corvane RX6 (3.0 turbo inline-six)",
    vehicleId: DEMO_VEHICLES[1].id,
    status: "sized",
    inputs: {
      engine: {
        cylinders: 6,
        displacementL: 3.0,
        aspiration: "turbo",
        redlineRpm: 7200,
        idleRpm: 850,
        maxBoostKpa: 170,
      },
      target: { powerKw: 373, measuredAt: "wheel", drivetrainLossPct: 15 },
      fuel: { ethanolMinVolPct: 51, ethanolMaxVolPct: 83 },
      injectors: { count: 6, ratedFlowCcPerMin: 1300, ratedPressureKpa: 300, minPulseWidthMs: 0.8 },
      regulator: { type: "boost-referenced", basePressureKpa: 400 },
      pumps: [pump(2)],
      electrical: { voltageAtPump: 13.0 },
      lines: {
        feed: { insideDiameterMm: 11.1, lengthM: 5, fittingsK: 2 },
        return: { insideDiameterMm: 11.1, lengthM: 5, fittingsK: 0 },
      },
      filters: { postPumpDropKpa: 10 },
    },
  },
  {
    id: "10000000-0000-4000-8000-000000000003",
    customerId: CUSTOMERS[2]!.id,
    title: "Twin-turbo V8, last of the injectors",
    vehicle: "2012 Brennan Stag (5.0 twin-turbo V8)",
    vehicleId: DEMO_VEHICLES[2].id,
    status: "quoted",
    inputs: {
      engine: {
        cylinders: 8,
        displacementL: 5.0,
        aspiration: "turbo",
        redlineRpm: 7000,
        idleRpm: 800,
        maxBoostKpa: 140,
      },
      target: { powerKw: 700, measuredAt: "crank", drivetrainLossPct: 15 },
      fuel: { ethanolMinVolPct: 70, ethanolMaxVolPct: 85 },
      injectors: { count: 8, ratedFlowCcPerMin: 1600, ratedPressureKpa: 300 },
      regulator: { type: "boost-referenced", basePressureKpa: 400 },
      pumps: [pump(3)],
      electrical: { voltageAtPump: 13.2 },
    },
  },
  {
    id: "10000000-0000-4000-8000-000000000004",
    customerId: CUSTOMERS[4]!.id,
    title: "Supercharged V6 that leans out at boost",
    vehicle: "2007 Ostrander GT (3.5 supercharged V6)",
    vehicleId: DEMO_VEHICLES[3].id,
    status: "draft",
    inputs: {
      engine: {
        cylinders: 6,
        displacementL: 3.5,
        aspiration: "supercharged",
        redlineRpm: 6800,
        idleRpm: 750,
        maxBoostKpa: 90,
      },
      target: { powerKw: 330, measuredAt: "wheel", drivetrainLossPct: 17 },
      fuel: { ethanolMinVolPct: 0, ethanolMaxVolPct: 10 },
      injectors: { count: 6, ratedFlowCcPerMin: 550, ratedPressureKpa: 300 },
      regulator: { type: "fixed", basePressureKpa: 380 },
      pumps: [pump(1, 0.7)],
      electrical: { voltageAtPump: 12.5 },
    },
  },
  {
    // The counter took this one on the phone: the goal set, the rest starting values.
    id: "10000000-0000-4000-8000-000000000005",
    customerId: CUSTOMERS[3]!.id,
    title: "1998 Tamsin Coupe 2.2: 260 kW at the wheels on E85",
    vehicle: "1998 Tamsin Coupe 2.2 (2.2 turbo four)",
    vehicleId: DEMO_VEHICLES[4].id,
    status: "needs_sizing",
    by: "counter",
    inputs: {
      engine: {
        cylinders: 4,
        displacementL: 2.2,
        aspiration: "turbo",
        redlineRpm: 7000,
        idleRpm: 850,
        maxBoostKpa: 150,
      },
      target: { powerKw: 260, measuredAt: "wheel", driveType: "manual" },
      fuel: { ethanolMinVolPct: 51, ethanolMaxVolPct: 83 },
      injectors: { count: 4, ratedFlowCcPerMin: 1000, ratedPressureKpa: 300 },
      regulator: { type: "boost-referenced", basePressureKpa: 300 },
      pumps: [pump(1)],
      electrical: { voltageAtPump: 13.0 },
    },
  },
];

/** The demo quotes: the fitted build's accepted, the quoted build's sent, the draft build's draft. */
export function demoQuotes() {
  const bySku = new Map(DEMO_PARTS.map((p) => [p.sku, p]));
  const partLine = (sku: string, qty: number) => ({
    kind: "part" as const,
    partId: bySku.get(sku)!.id,
    sku,
    description: `${bySku.get(sku)!.brand} ${bySku.get(sku)!.name}`,
    quantityMilli: qty * 1000,
    unitPriceMinor: bySku.get(sku)!.priceMinor,
    discountBp: 0,
  });
  const labour = (hours: number) => ({
    kind: "labour" as const,
    partId: null,
    sku: null,
    description: "Fuel system fitting and setup",
    quantityMilli: hours * 1000,
    unitPriceMinor: 12000,
    discountBp: 0,
  });
  return [
    {
      id: "30000000-0000-4000-8000-000000000001",
      number: 1,
      build: DEMO_BUILDS[0]!,
      status: "accepted" as const,
      validUntil: "2099-12-31",
      lines: [
        partLine("HF-INJ-1000", 6),
        partLine("KF-P400", 1),
        partLine("TH-HOSE-8P", 5),
        partLine("HF-ECS-1", 1),
        { ...labour(5), discountBp: 1000 },
      ],
    },
    {
      id: "30000000-0000-4000-8000-000000000002",
      number: 2,
      build: DEMO_BUILDS[2]!,
      status: "sent" as const,
      validUntil: "2099-06-30",
      lines: [
        partLine("HF-INJ-2200", 8),
        partLine("OM-IL500", 2),
        partLine("KF-HAT-2", 1),
        labour(8),
      ],
    },
    {
      id: "30000000-0000-4000-8000-000000000003",
      number: 3,
      build: DEMO_BUILDS[3]!,
      status: "draft" as const,
      validUntil: "2099-03-31",
      lines: [partLine("HF-INJ-750", 6), partLine("SW-REG-BR6", 1), labour(3)],
    },
  ];
}

export async function seed(url: string) {
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  const db = drizzle(sql, { schema });
  try {
    const hash = await hashPassword(DEMO_PASSWORD);
    await db.transaction(async (tx) => {
      const newShop = await tx
        .insert(schema.organization)
        .values({ id: DEMO_SHOP_ID, name: "Ridgeback Fuel & Dyno", slug: "ridgeback-fuel-dyno" })
        .onConflictDoNothing()
        .returning({ id: schema.organization.id });
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
        await tx
          .insert(schema.user)
          .values({ id: u.id, name: u.name, email: u.email, emailVerified: true })
          .onConflictDoNothing();
        await tx
          .insert(schema.account)
          .values({
            id: `${u.id}-credential`,
            accountId: u.id,
            providerId: "credential",
            userId: u.id,
            password: hash,
          })
          .onConflictDoNothing();
        await tx
          .insert(schema.member)
          .values({
            id: `${u.id}-member`,
            organizationId: DEMO_SHOP_ID,
            userId: u.id,
            role: u.role,
          })
          .onConflictDoNothing();
      }
      // The owner hears the shop's notices, as at sign-up; only when the shop is made, so a later
      // seed never turns back on what the owner turned off in Settings.
      if (newShop.length)
        await tx
          .insert(schema.shopNoticeSubscribers)
          .values({ shopId: DEMO_SHOP_ID, userId: DEMO_USERS.find((u) => u.role === "owner")!.id })
          .onConflictDoNothing();
      for (const c of CUSTOMERS)
        await tx
          .insert(schema.customers)
          .values({ ...c, shopId: DEMO_SHOP_ID })
          .onConflictDoNothing();
      for (const v of DEMO_VEHICLES)
        await tx
          .insert(schema.vehicles)
          .values({ ...v, shopId: DEMO_SHOP_ID })
          .onConflictDoNothing();
      // Sized like every save: the build's own inputs with the demo shop's settings.
      const [demoSettings] = await tx
        .select()
        .from(schema.shopSettings)
        .where(eq(schema.shopSettings.shopId, DEMO_SHOP_ID));
      const sizingSettings = sizingSettingsOf(demoSettings!);
      for (const b of DEMO_BUILDS) {
        const inputs = FuelSystemInputSchema.parse(b.inputs);
        const result = sizeParsedFuelSystem(parsedEffectiveInputs(sizingSettings, inputs));
        const row = {
          shopId: DEMO_SHOP_ID,
          inputs,
          inputsSchemaVersion: INPUTS_SCHEMA_VERSION,
          result,
          calcVersion: CALC_VERSION,
          sizingSettings,
        };
        const inserted = await tx
          .insert(schema.builds)
          .values({
            ...row,
            id: b.id,
            customerId: b.customerId,
            title: b.title,
            vehicle: b.vehicle,
            vehicleId: b.vehicleId,
            status: b.status,
            tunerId: b.by ? null : "demo-user-tuner",
            createdBy: b.by ? "demo-user-counter" : "demo-user-tuner",
            updatedBy: b.by ? "demo-user-counter" : "demo-user-tuner",
          })
          .onConflictDoNothing()
          .returning({ id: schema.builds.id });
        if (inserted.length)
          await tx.insert(schema.buildRevisions).values({
            ...row,
            buildId: b.id,
            version: 1,
            status: b.status,
            authorId: b.by ? "demo-user-counter" : "demo-user-tuner",
            note: b.by ? "Goal taken on the phone (demo)" : "Demo build",
          });
      }
      // Seeded before the status rules: the first demo build as verified with no dyno log. Left
      // untouched (version 1), it becomes fitted, as seeded now.
      const first = DEMO_BUILDS[0]!.id;
      await tx.execute(
        dsql`update builds b set status = 'fitted' where b.id = ${first} and b.version = 1 and b.status = 'verified' and not exists (select 1 from datalogs d where d.build_id = b.id and d.verified_at is not null)`,
      );
      await tx.execute(
        dsql`update build_revisions r set status = 'fitted' where r.build_id = ${first} and r.version = 1 and r.status = 'verified' and (select status from builds where id = ${first}) = 'fitted'`,
      );
      for (const p of DEMO_PARTS)
        await tx
          .insert(schema.parts)
          .values({ ...p, shopId: DEMO_SHOP_ID })
          .onConflictDoNothing();
      const QUOTES = demoQuotes();
      for (const q of QUOTES) {
        const t = quoteTotals(q.lines, 825);
        const inserted = await tx
          .insert(schema.quotes)
          .values({
            id: q.id,
            shopId: DEMO_SHOP_ID,
            number: q.number,
            customerId: q.build.customerId,
            buildId: q.build.id,
            status: q.status,
            ...(q.status === "accepted" ? { acceptedAt: new Date("2026-01-05T10:00:00Z") } : {}),
            currency: "USD",
            taxRateBp: 825,
            validUntil: q.validUntil,
            notes: `For ${q.build.title}`,
            subtotalMinor: t.subtotalMinor,
            discountMinor: t.discountMinor,
            taxMinor: t.taxMinor,
            totalMinor: t.totalMinor,
            createdBy: "demo-user-counter",
          })
          .onConflictDoNothing()
          .returning({ id: schema.quotes.id });
        if (!inserted.length) continue;
        // An accepted demo quote holds what is free of its parts (as accepting does), per line.
        const held: number[] = [];
        for (const l of q.lines) {
          let h = 0;
          if (q.status === "accepted" && l.partId) {
            const [p] = await tx
              .select({ stock: schema.parts.stock, reserved: schema.parts.reserved })
              .from(schema.parts)
              .where(eq(schema.parts.id, l.partId))
              .for("update");
            h = p
              ? Math.min(Math.ceil(l.quantityMilli / 1000), Math.max(0, p.stock - p.reserved))
              : 0;
            if (h)
              await tx
                .update(schema.parts)
                .set({ reserved: dsql`${schema.parts.reserved} + ${h}` })
                .where(eq(schema.parts.id, l.partId));
          }
          held.push(h);
        }
        await tx.insert(schema.quoteLines).values(
          q.lines.map((l, i) => ({
            ...l,
            shopId: DEMO_SHOP_ID,
            quoteId: q.id,
            position: i + 1,
            heldQty: held[i]!,
          })),
        );
      }
      await tx
        .insert(schema.shopCounters)
        .values({ shopId: DEMO_SHOP_ID, name: "quote", value: QUOTES.length })
        .onConflictDoUpdate({
          target: [schema.shopCounters.shopId, schema.shopCounters.name],
          set: { value: dsql`greatest(${schema.shopCounters.value}, ${QUOTES.length})` },
        });
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
