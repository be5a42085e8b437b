import { expect } from "vitest";

import { DEFAULT_BSFC } from "@/lib/calc";

import { formOf } from "./actions";
import { sql } from "./db";
import { BASE_URL, request, type Client } from "./http";

/**
 * The app's surface for the suites that walk all of it (access matrix, hostile input): every
 * route handler and server action with a call that passes validation where that is cheap, and
 * the fixtures those calls aim at (made fresh, so nothing shared is disturbed).
 */
export const WHO = ["anon", "owner", "tuner", "counter", "customer", "outsider"] as const;
export type Who = (typeof WHO)[number];

export interface Fx {
  build: string;
  /** A customer record made for the run (the customer routes and actions edit it). */
  customer: string;
  /** Vehicles of `customer`: one the vehicle actions edit, one they remove. */
  vehicle: string;
  doomedVehicle: string;
  doomedCustomer: string;
  part: string;
  doomedPart: string;
  doomedSku: string;
  quote: string;
  datalog: string;
  /** A pull of the build's tune session, and one the delete route and action remove. */
  pull: string;
  doomedPull: string;
  share: string;
  inputs: unknown;
  portalCustomer: string;
  supplier: string;
  doomedSupplier: string;
  purchaseOrder: string;
  purchaseOrderLine: string;
  /** A draft purchase order the cancel route and action cancel. */
  doomedPurchaseOrder: string;
  /** A quote of the portal customer with its deposit paid (no job yet). */
  paidQuote: string;
  /** The portal customer's job, fitted and invoiced; and one ready to fit. */
  job: string;
  readyJob: string;
  /** The fitted job's invoice, issued; and an e-mail logged on it. */
  invoice: string;
  mail: string;
}

export interface Cell {
  /** The request: path (with fixture ids), and a body that passes validation where that is cheap. */
  call: (f: Fx) => { path: string; body?: unknown; raw?: { body: BodyInit; type: string } };
  expect: string;
  /** An allowed caller may find the target already deleted by the one before it. */
  mayVanish?: boolean;
}
const CSV = (body: string) => ({ body, type: "text/csv" });
export const ROUTES: Record<string, Cell> = {
  "GET /api/health": { call: () => ({ path: "/api/health" }), expect: "ok ok ok ok ok ok" },
  // The benchmark's yardstick: served only by `npm run bench:http`'s server (BENCH_ROUTES=on).
  "POST /api/bench/size": {
    call: () => ({ path: "/api/bench/size", body: {} }),
    expect: "404 404 404 404 404 404",
  },
  // Any /api address no route answers: a JSON 404 for everyone (tests/integration/unknown-api).
  ...Object.fromEntries(
    (["GET", "POST", "PUT", "PATCH", "DELETE"] as const).map((m) => [
      `${m} /api/[...unknown]`,
      {
        call: () => ({ path: "/api/v1/no-such-thing", ...(m === "GET" ? {} : { body: {} }) }),
        expect: "404 404 404 404 404 404",
      } satisfies Cell,
    ]),
  ),
  "GET /api/auth/[...all]": {
    call: () => ({ path: "/api/auth/get-session" }),
    expect: "ok ok ok ok ok ok",
  },
  "POST /api/auth/[...all]": {
    call: () => ({
      path: "/api/auth/request-password-reset",
      body: { email: "nobody@nowhere.fuelwright.test", redirectTo: "/reset-password" },
    }),
    expect: "ok ok ok ok ok ok",
  },
  "POST /api/webhooks/payments": {
    call: () => ({ path: "/api/webhooks/payments", body: { id: "evt_forged" } }),
    expect: "ok ok ok ok ok ok",
  },
  "GET /share/[token]/pdf": {
    call: () => ({ path: "/share/not-a-real-token/pdf" }),
    expect: "ok ok ok ok ok ok",
    mayVanish: true,
  },

  "GET /api/v1/builds": { call: () => ({ path: "/api/v1/builds" }), expect: "401 ok ok ok ok ok" },
  "POST /api/v1/builds": {
    call: (f) => ({
      path: "/api/v1/builds",
      body: { customerId: f.customer, title: "Matrix build", inputs: f.inputs },
    }),
    expect: "401 ok ok 403 403 422",
  },
  "GET /api/v1/builds/[id]": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}` }),
    expect: "401 ok ok ok ok 404",
  },
  "PATCH /api/v1/builds/[id]": {
    call: (f) => ({
      path: `/api/v1/builds/${f.build}`,
      body: { version: 1, title: "Matrix build", inputs: f.inputs },
    }),
    expect: "401 ok ok 403 403 404",
  },
  "GET /api/v1/builds/[id]/revisions": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/revisions` }),
    expect: "401 ok ok ok ok 404",
  },
  "GET /api/v1/builds/[id]/spec-sheet": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/spec-sheet` }),
    expect: "401 ok ok ok ok 404",
  },
  "GET /api/v1/builds/[id]/datalogs": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/datalogs` }),
    expect: "401 ok ok ok 403 404",
  },
  "POST /api/v1/builds/[id]/datalogs": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/datalogs`, raw: CSV("rpm,duty\n3000,40\n") }),
    expect: "401 ok ok 403 403 404",
  },
  "GET /api/v1/builds/[id]/tune": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/tune` }),
    expect: "401 ok ok ok 403 404",
  },
  "PATCH /api/v1/builds/[id]/tune": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/tune`, body: { limits: null } }),
    expect: "401 ok ok 403 403 404",
  },
  "POST /api/v1/builds/[id]/tune/pulls": {
    call: (f) => ({
      path: `/api/v1/builds/${f.build}/tune/pulls?ethanolPct=85&powerMeasuredAt=crank`,
      raw: CSV("rpm,duty\n3000,40\n3100,41\n"),
    }),
    expect: "401 ok ok 403 403 404",
  },
  "POST /api/v1/builds/[id]/next-step": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/next-step`, body: { powerKw: 300 } }),
    expect: "401 ok ok 403 403 404",
  },
  "PATCH /api/v1/tune-pulls/[id]": {
    call: (f) => ({ path: `/api/v1/tune-pulls/${f.pull}`, body: { notes: "Access matrix" } }),
    expect: "401 ok ok 403 403 404",
  },
  "DELETE /api/v1/tune-pulls/[id]": {
    call: (f) => ({ path: `/api/v1/tune-pulls/${f.doomedPull}` }),
    expect: "401 ok ok 403 403 404",
    mayVanish: true,
  },
  "GET /api/v1/builds/[id]/kit": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/kit` }),
    expect: "401 ok ok ok 403 404",
  },
  "POST /api/v1/builds/[id]/kit": {
    call: (f) => ({
      path: `/api/v1/builds/${f.build}/kit`,
      body: { version: 1, parts: [{ role: "filter", partId: f.part, quantity: 1 }] },
    }),
    expect: "401 ok ok ok 403 404",
  },
  "GET /api/v1/builds/[id]/share-links": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/share-links` }),
    expect: "401 ok ok ok 403 404",
  },
  "POST /api/v1/builds/[id]/share-links": {
    call: (f) => ({ path: `/api/v1/builds/${f.build}/share-links`, body: { days: 1 } }),
    expect: "401 ok ok ok 403 404",
  },
  "DELETE /api/v1/share-links/[id]": {
    call: (f) => ({ path: `/api/v1/share-links/${f.share}` }),
    expect: "401 ok ok ok 403 404",
    mayVanish: true,
  },
  "POST /api/v1/calc/size": {
    call: (f) => ({ path: "/api/v1/calc/size", body: f.inputs }),
    expect: "401 ok ok ok ok ok",
  },
  "POST /api/v1/calc/blend": {
    call: () => ({ path: "/api/v1/calc/blend", body: {} }),
    expect: "401 ok ok ok ok ok",
  },
  "GET /api/v1/customers": {
    call: () => ({ path: "/api/v1/customers" }),
    expect: "401 ok ok ok 403 ok",
  },
  "POST /api/v1/customers": {
    call: () => ({ path: "/api/v1/customers", body: { name: "Matrix customer" } }),
    expect: "401 ok ok ok 403 ok",
  },
  "GET /api/v1/customers/[id]": {
    call: (f) => ({ path: `/api/v1/customers/${f.customer}` }),
    expect: "401 ok ok ok 403 404",
  },
  "PATCH /api/v1/customers/[id]": {
    call: (f) => ({
      path: `/api/v1/customers/${f.customer}`,
      body: { name: "Matrix customer (renamed)" },
    }),
    expect: "401 ok ok ok 403 404",
  },
  "DELETE /api/v1/customers/[id]": {
    call: (f) => ({ path: `/api/v1/customers/${f.doomedCustomer}` }),
    expect: "401 ok ok ok 403 404",
    mayVanish: true,
  },
  "GET /api/v1/datalogs/[id]": {
    call: (f) => ({ path: `/api/v1/datalogs/${f.datalog}` }),
    expect: "401 ok ok ok 403 404",
  },
  "GET /api/v1/datalogs/[id]/file": {
    call: (f) => ({ path: `/api/v1/datalogs/${f.datalog}/file` }),
    expect: "401 ok ok ok 403 404",
  },
  "POST /api/v1/datalogs/[id]/analysis": {
    call: (f) => ({
      path: `/api/v1/datalogs/${f.datalog}/analysis`,
      body: { mapping: { rpm: "rpm", duty: { column: "duty", kind: "duty_pct" } } },
    }),
    expect: "401 ok ok 403 403 404",
  },
  "POST /api/v1/datalogs/[id]/verify": {
    call: (f) => ({ path: `/api/v1/datalogs/${f.datalog}/verify` }),
    expect: "401 ok ok 403 403 404",
  },
  "GET /api/v1/parts": { call: () => ({ path: "/api/v1/parts" }), expect: "401 ok ok ok 403 ok" },
  "POST /api/v1/parts": {
    call: (f) => ({
      path: "/api/v1/parts",
      body: {
        sku: `${f.doomedSku}-N`,
        category: "fitting",
        brand: "Matrixware",
        name: "Matrix new part",
        price: "1.00",
        stock: "1",
      },
    }),
    expect: "401 ok 403 ok 403 ok",
  },
  "GET /api/v1/parts/[id]": {
    call: (f) => ({ path: `/api/v1/parts/${f.part}` }),
    expect: "401 ok ok ok 403 404",
  },
  "PATCH /api/v1/parts/[id]": {
    call: (f) => ({
      path: `/api/v1/parts/${f.doomedPart}`,
      body: {
        sku: f.doomedSku,
        category: "fitting",
        brand: "Matrixware",
        name: "Access matrix part (renamed)",
        price: "1.00",
        stock: "1",
      },
    }),
    expect: "401 ok 403 ok 403 404",
  },
  "DELETE /api/v1/parts/[id]": {
    call: (f) => ({ path: `/api/v1/parts/${f.doomedPart}` }),
    expect: "401 ok 403 ok 403 404",
    mayVanish: true,
  },
  "GET /api/v1/parts/export": {
    call: () => ({ path: "/api/v1/parts/export" }),
    expect: "401 ok ok ok 403 ok",
  },
  "POST /api/v1/parts/import": {
    call: () => ({ path: "/api/v1/parts/import?dryRun=1", raw: CSV("sku,name\n") }),
    expect: "401 ok 403 ok 403 ok",
  },
  "GET /api/v1/quotes": { call: () => ({ path: "/api/v1/quotes" }), expect: "401 ok ok ok ok ok" },
  "POST /api/v1/quotes": {
    call: (f) => ({ path: "/api/v1/quotes", body: { buildId: f.build } }),
    expect: "401 ok 403 ok 403 422",
  },
  "GET /api/v1/quotes/[id]": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}` }),
    expect: "401 ok ok ok 404 404",
  },
  "PATCH /api/v1/quotes/[id]": {
    call: (f) => ({
      path: `/api/v1/quotes/${f.quote}`,
      body: { version: 1, validUntil: "2099-01-31", notes: "Matrix", lines: [] },
    }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/quotes/[id]/status": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/status`, body: { status: "expired" } }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/quotes/[id]/send": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/send` }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/quotes/[id]/revise": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/revise` }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/quotes/[id]/respond": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/respond`, body: { decision: "accept" } }),
    expect: "401 403 403 403 404 403",
  },
  "POST /api/v1/quotes/[id]/deposit": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/deposit` }),
    expect: "401 403 403 403 404 403",
  },
  "GET /api/v1/quotes/[id]/deposit": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/deposit?session=cs_matrix` }),
    expect: "401 403 403 403 404 403",
  },
  "GET /api/v1/quotes/[id]/pdf": {
    call: (f) => ({ path: `/api/v1/quotes/${f.quote}/pdf` }),
    expect: "401 ok ok ok 404 404",
  },
  "GET /api/v1/suppliers": {
    call: () => ({ path: "/api/v1/suppliers" }),
    expect: "401 ok ok ok 403 ok",
  },
  "POST /api/v1/suppliers": {
    call: () => ({ path: "/api/v1/suppliers", body: { name: "Matrix supplier" } }),
    expect: "401 ok 403 ok 403 ok",
  },
  "GET /api/v1/suppliers/[id]": {
    call: (f) => ({ path: `/api/v1/suppliers/${f.supplier}` }),
    expect: "401 ok ok ok 403 404",
  },
  "PATCH /api/v1/suppliers/[id]": {
    call: (f) => ({ path: `/api/v1/suppliers/${f.supplier}`, body: { notes: "Matrix" } }),
    expect: "401 ok 403 ok 403 404",
  },
  "DELETE /api/v1/suppliers/[id]": {
    call: (f) => ({ path: `/api/v1/suppliers/${f.doomedSupplier}` }),
    expect: "401 ok 403 ok 403 404",
    mayVanish: true,
  },
  "GET /api/v1/purchase-orders": {
    call: () => ({ path: "/api/v1/purchase-orders" }),
    expect: "401 ok ok ok 403 ok",
  },
  "POST /api/v1/purchase-orders": {
    call: (f) => ({
      path: "/api/v1/purchase-orders",
      body: { supplierId: f.supplier, lines: [{ partId: f.part, quantity: 1 }] },
    }),
    expect: "401 ok 403 ok 403 422",
  },
  "GET /api/v1/purchase-orders/[id]": {
    call: (f) => ({ path: `/api/v1/purchase-orders/${f.purchaseOrder}` }),
    expect: "401 ok ok ok 403 404",
  },
  "GET /api/v1/purchase-orders/[id]/pdf": {
    call: (f) => ({ path: `/api/v1/purchase-orders/${f.purchaseOrder}/pdf` }),
    expect: "401 ok ok ok 403 404",
  },
  "POST /api/v1/purchase-orders/[id]/receive": {
    call: (f) => ({
      path: `/api/v1/purchase-orders/${f.purchaseOrder}/receive`,
      body: { lines: [{ lineId: f.purchaseOrderLine, quantity: 1 }] },
    }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/purchase-orders/[id]/cancel": {
    call: (f) => ({
      path: `/api/v1/purchase-orders/${f.doomedPurchaseOrder}/cancel`,
      body: { version: 1 },
    }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/purchase-orders/[id]/send": {
    call: (f) => ({ path: `/api/v1/purchase-orders/${f.purchaseOrder}/send` }),
    expect: "401 ok 403 ok 403 404",
  },
  "GET /api/v1/reorder-list": {
    call: () => ({ path: "/api/v1/reorder-list" }),
    expect: "401 ok ok ok 403 ok",
  },
  "GET /api/v1/jobs": { call: () => ({ path: "/api/v1/jobs" }), expect: "401 ok ok ok ok ok" },
  "POST /api/v1/jobs": {
    call: (f) => ({ path: "/api/v1/jobs", body: { quoteId: f.paidQuote } }),
    expect: "401 ok ok ok 403 422",
  },
  "GET /api/v1/jobs/[id]": {
    call: (f) => ({ path: `/api/v1/jobs/${f.job}` }),
    expect: "401 ok ok ok ok 404",
  },
  "POST /api/v1/jobs/[id]/fit": {
    call: (f) => ({
      path: `/api/v1/jobs/${f.readyJob}/fit`,
      body: { version: 1, parts: [], labourMilli: 1000 },
    }),
    expect: "401 ok ok ok 403 404",
  },
  "GET /api/v1/invoices": {
    call: () => ({ path: "/api/v1/invoices" }),
    expect: "401 ok ok ok ok ok",
  },
  "POST /api/v1/invoices": {
    call: (f) => ({ path: "/api/v1/invoices", body: { jobId: f.job } }),
    expect: "401 ok 403 ok 403 422",
  },
  "GET /api/v1/invoices/[id]": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}` }),
    expect: "401 ok ok ok ok 404",
  },
  "PATCH /api/v1/invoices/[id]": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}`, body: { version: 1, notes: "Matrix" } }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/invoices/[id]/issue": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}/issue`, body: { version: 1 } }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/invoices/[id]/credit-notes": {
    call: (f) => ({
      path: `/api/v1/invoices/${f.invoice}/credit-notes`,
      body: { reason: "Matrix", amountMinor: 1 },
    }),
    expect: "401 ok 403 ok 403 404",
  },
  "POST /api/v1/invoices/[id]/payment": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}/payment` }),
    expect: "401 403 403 403 ok 403",
  },
  "GET /api/v1/invoices/[id]/payment": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}/payment?session=cs_matrix` }),
    expect: "401 403 403 403 404 403",
  },
  "GET /api/v1/invoices/[id]/pdf": {
    call: (f) => ({ path: `/api/v1/invoices/${f.invoice}/pdf` }),
    expect: "401 ok ok ok ok 404",
  },
  "POST /api/v1/mail/[id]/retry": {
    call: (f) => ({ path: `/api/v1/mail/${f.mail}/retry` }),
    expect: "401 ok ok ok 403 404",
  },
  "GET /api/v1/shop/notices": {
    call: () => ({ path: "/api/v1/shop/notices" }),
    expect: "401 ok ok ok 403 ok",
  },
  "PUT /api/v1/shop/notices": {
    call: () => ({ path: "/api/v1/shop/notices", body: { on: false } }),
    expect: "401 ok ok ok 403 ok",
  },
  "GET /api/v1/shop/bsfc": {
    call: () => ({ path: "/api/v1/shop/bsfc" }),
    expect: "401 ok ok ok 403 ok",
  },
  "GET /api/v1/shop/settings": {
    call: () => ({ path: "/api/v1/shop/settings" }),
    expect: "401 ok ok ok 403 ok",
  },
  "PATCH /api/v1/shop/settings": {
    // The demo shop's own phone (db/seed.ts): the owner's change changes nothing that matters.
    call: () => ({ path: "/api/v1/shop/settings", body: { phone: "555-0100" } }),
    expect: "401 ok 403 403 403 ok",
  },
  "GET /api/v1/shop/logo": {
    call: () => ({ path: "/api/v1/shop/logo" }),
    expect: "401 ok ok ok ok ok",
    mayVanish: true,
  },
  "PUT /api/v1/shop/logo": {
    call: () => ({ path: "/api/v1/shop/logo", raw: { body: "not an image", type: "image/png" } }),
    expect: "401 ok 403 403 403 ok",
  },
  "DELETE /api/v1/shop/logo": {
    call: () => ({ path: "/api/v1/shop/logo" }),
    expect: "401 ok 403 403 403 ok",
    mayVanish: true,
  },
};

export interface ActionCell {
  page: (f: Fx) => string;
  args: (f: Fx) => unknown[];
  expect: string;
  mayVanish?: boolean;
}
const prev = { ok: false };
const NO_MEMBER = "00000000-0000-4000-8000-00000000abcd";
/** The demo shop's settings as its form sends them (db/seed.ts and the column defaults). */
export const SEED_SETTINGS_FORM = {
  shopName: "Ridgeback Fuel & Dyno",
  currency: "USD",
  taxRatePct: "8.25",
  units: "imperial",
  paperSize: "letter",
  timeZone: "UTC",
  address: "14 Foundry Lane, Millbrook",
  phone: "555-0100",
  bsfcGasolineNa: String(DEFAULT_BSFC.gasolineNaGPerKwh),
  bsfcGasolineBoosted: String(DEFAULT_BSFC.gasolineBoostedGPerKwh),
  bsfcE85Na: String(DEFAULT_BSFC.e85NaGPerKwh),
  bsfcE85Boosted: String(DEFAULT_BSFC.e85BoostedGPerKwh),
  designDutyPct: "80",
  dutyCautionPct: "80",
  dutyDangerPct: "90",
  minPumpMarginPct: "25",
  maxLineDropKpa: "14",
  lossManualPct: "12",
  lossAutomaticPct: "17",
  lossAwdPct: "22",
  labourRate: "120",
  depositPct: "30",
  quoteValidDays: "30",
};
export const ACTIONS: Record<string, ActionCell> = {
  "app/(shop)/builds/new/actions.ts#createBuildAction": {
    page: () => "/builds/new",
    args: (f) => [prev, formOf({ customerId: f.customer, title: "Matrix action build" })],
    expect: "401 ok ok 403 403 422",
  },
  // The counter's goal form: a draft build in "needs sizing" (the counter may; another shop's
  // owner names a customer unknown to them).
  "app/(shop)/builds/new/actions.ts#createDraftBuildAction": {
    page: () => "/builds/new",
    args: (f) => [
      prev,
      formOf({
        customerId: f.customer,
        vehicleId: f.vehicle,
        units: "metric",
        displacement: "2.0",
        cylinders: "4",
        aspiration: "turbo",
        power: "250",
        measuredAt: "wheel",
        fuel: "e85",
      }),
    ],
    expect: "401 ok ok ok 403 422",
  },
  "lib/builds/build-actions.ts#saveBuildAction": {
    page: (f) => `/builds/${f.build}`,
    args: (f) => [prev, { id: f.build, version: 1, title: "Matrix build", inputs: f.inputs }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/builds/build-actions.ts#copyBuildAction": {
    page: (f) => `/builds/${f.build}`,
    args: (f) => [prev, { id: f.build }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/builds/build-actions.ts#chooseKitAction": {
    page: (f) => `/builds/${f.build}/kit`,
    args: (f) => [
      prev,
      { id: f.build, version: 1, parts: [{ role: "filter", partId: f.part, quantity: 1 }] },
    ],
    expect: "401 ok ok ok 403 404",
  },
  "app/(shop)/builds/[id]/revisions/[version]/actions.ts#restoreRevisionAction": {
    page: (f) => `/builds/${f.build}/revisions/1`,
    args: (f) => [prev, { buildId: f.build, version: 1, currentVersion: 999999 }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/dyno/dyno-actions.ts#analyseDatalogAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [
      prev,
      { id: f.datalog, mapping: { rpm: "rpm", duty: { column: "duty", kind: "duty_pct" } } },
    ],
    expect: "401 ok ok 403 403 404",
  },
  "lib/tune/tune-actions.ts#updateTunePullAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [prev, { id: f.pull, notes: "Access matrix action" }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/tune/tune-actions.ts#deleteTunePullAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [prev, { id: f.doomedPull }],
    expect: "401 ok ok 403 403 404",
    mayVanish: true,
  },
  "lib/tune/tune-actions.ts#saveTuneLimitsAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [prev, { buildId: f.build, limits: null }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/tune/tune-actions.ts#nextPowerStepAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [prev, { buildId: f.build, powerKw: 300 }],
    expect: "401 ok ok 403 403 404",
  },
  "lib/dyno/dyno-actions.ts#verifyDatalogAction": {
    page: (f) => `/builds/${f.build}/dyno`,
    args: (f) => [prev, { id: f.datalog }],
    expect: "401 ok ok 403 403 404",
  },
  "app/(shop)/customers/actions.ts#createCustomerAction": {
    page: () => "/customers",
    args: () => [prev, formOf({ name: "Matrix action customer" })],
    expect: "401 ok ok ok 403 ok",
  },
  "app/(shop)/customers/actions.ts#updateCustomerAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [prev, formOf({ id: f.customer, name: "Matrix customer (action)" })],
    expect: "401 ok ok ok 403 404",
  },
  "app/(shop)/customers/actions.ts#deleteCustomerAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [prev, formOf({ id: f.doomedCustomer })],
    expect: "401 ok ok ok 403 404",
    mayVanish: true,
  },
  "app/(shop)/customers/actions.ts#addVehicleAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [
      prev,
      formOf({ customerId: f.customer, year: "2001", make: "Matrixware", model: "Added" }),
    ],
    expect: "401 ok ok ok 403 404",
  },
  "app/(shop)/customers/actions.ts#updateVehicleAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [prev, formOf({ id: f.vehicle, model: "Matrix (edited)" })],
    expect: "401 ok ok ok 403 404",
  },
  "app/(shop)/customers/actions.ts#deleteVehicleAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [prev, formOf({ id: f.doomedVehicle })],
    expect: "401 ok ok ok 403 404",
    mayVanish: true,
  },
  "app/(shop)/customers/actions.ts#invitePortalAction": {
    page: (f) => `/customers/${f.customer}`,
    args: (f) => [prev, formOf({ id: f.customer })],
    expect: "401 ok ok ok 403 404",
  },
  "lib/parts/part-actions.ts#createPartAction": {
    page: () => "/parts/new",
    args: (f) => [
      prev,
      {
        sku: `${f.doomedSku}-A`,
        category: "fitting",
        brand: "Matrixware",
        name: "Matrix action part",
        price: "1.00",
        stock: "1",
      },
    ],
    expect: "401 ok 403 ok 403 ok",
  },
  "lib/parts/part-actions.ts#updatePartAction": {
    page: () => "/parts/new",
    args: (f) => [prev, { id: f.doomedPart, name: "Access matrix part (action)" }],
    expect: "401 ok 403 ok 403 404",
    mayVanish: true,
  },
  "lib/parts/part-actions.ts#deletePartAction": {
    page: () => "/parts/new",
    args: (f) => [prev, { id: f.doomedPart }],
    expect: "401 ok 403 ok 403 404",
    mayVanish: true,
  },
  "app/(shop)/settings/actions.ts#updateSettingsAction": {
    page: () => "/settings",
    // The demo shop's own settings (db/seed.ts): the owner's save changes nothing that matters.
    args: () => [prev, formOf(SEED_SETTINGS_FORM)],
    expect: "401 ok 403 403 403 ok",
  },
  "app/(shop)/settings/actions.ts#inviteMemberAction": {
    page: () => "/settings",
    // Already a member of the demo shop: refused for its owner (a field error), nothing sent.
    args: () => [prev, formOf({ email: "tuner@demo.fuelwright.test", role: "tuner" })],
    expect: "401 ok 403 403 403 ok",
  },
  "app/(shop)/settings/actions.ts#changeRoleAction": {
    page: () => "/settings",
    args: () => [prev, formOf({ memberId: NO_MEMBER, role: "tuner" })],
    expect: "401 ok 403 403 403 ok",
    mayVanish: true,
  },
  "app/(shop)/settings/actions.ts#removeMemberAction": {
    page: () => "/settings",
    args: () => [prev, formOf({ memberId: NO_MEMBER })],
    expect: "401 ok 403 403 403 ok",
    mayVanish: true,
  },
  // Quotes and deposits: the twins of the /api/v1/quotes rows. createQuoteAction is the kit
  // picker's "Create quote from the chosen parts".
  "lib/quotes/quote-actions.ts#createQuoteAction": {
    page: (f) => `/builds/${f.build}/kit`,
    args: (f) => [prev, { buildId: f.build }],
    expect: "401 ok 403 ok 403 422",
  },
  "lib/quotes/quote-actions.ts#editQuoteAction": {
    page: (f) => `/quotes/${f.quote}`,
    args: (f) => [
      prev,
      { id: f.quote, version: 1, validUntil: "2099-01-31", notes: "Matrix", lines: [] },
    ],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/quotes/quote-actions.ts#changeQuoteStatusAction": {
    page: (f) => `/quotes/${f.quote}`,
    args: (f) => [prev, { id: f.quote, status: "expired" }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/quotes/quote-actions.ts#sendQuoteAction": {
    page: (f) => `/quotes/${f.quote}`,
    args: (f) => [prev, { id: f.quote }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/quotes/quote-actions.ts#reviseQuoteAction": {
    page: (f) => `/quotes/${f.quote}`,
    args: (f) => [prev, { id: f.quote }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/quotes/quote-actions.ts#respondToQuoteAction": {
    page: (f) => `/my/quotes/${f.quote}`,
    args: (f) => [prev, { id: f.quote, decision: "accept" }],
    expect: "401 403 403 403 404 403",
  },
  "lib/quotes/quote-actions.ts#startDepositAction": {
    page: (f) => `/my/quotes/${f.quote}`,
    args: (f) => [prev, { id: f.quote }],
    expect: "401 403 403 403 404 403",
  },
  "lib/jobs/job-actions.ts#openJobAction": {
    page: () => "/jobs",
    args: (f) => [prev, { quoteId: f.paidQuote }],
    expect: "401 ok ok ok 403 422",
  },
  "lib/jobs/job-actions.ts#fitJobAction": {
    page: (f) => `/jobs/${f.readyJob}`,
    args: (f) => [prev, { id: f.readyJob, version: 1, parts: [], labourMilli: 1000 }],
    expect: "401 ok ok ok 403 404",
  },
  "lib/invoices/invoice-actions.ts#createInvoiceAction": {
    page: (f) => `/jobs/${f.job}`,
    args: (f) => [prev, { jobId: f.job }],
    expect: "401 ok 403 ok 403 422",
  },
  "lib/invoices/invoice-actions.ts#editInvoiceAction": {
    page: (f) => `/invoices/${f.invoice}`,
    // The fixture invoice is issued: allowed callers get 422 invoice_issued, nothing written.
    args: (f) => [prev, { id: f.invoice, version: 1, notes: "Matrix (action)" }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/invoices/invoice-actions.ts#issueInvoiceAction": {
    page: (f) => `/invoices/${f.invoice}`,
    args: (f) => [prev, { id: f.invoice, version: 1 }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/invoices/invoice-actions.ts#createCreditNoteAction": {
    page: (f) => `/invoices/${f.invoice}`,
    args: (f) => [prev, { id: f.invoice, reason: "Matrix", amountMinor: 1 }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/invoices/invoice-actions.ts#startBalanceAction": {
    page: (f) => `/my/invoices/${f.invoice}`,
    args: (f) => [prev, { id: f.invoice }],
    expect: "401 403 403 403 ok 403",
  },
  "lib/purchasing/purchasing-actions.ts#createSupplierAction": {
    page: () => "/purchasing",
    args: () => [prev, { name: "Matrix supplier (action)" }],
    expect: "401 ok 403 ok 403 ok",
  },
  "lib/purchasing/purchasing-actions.ts#updateSupplierAction": {
    page: (f) => `/purchasing/suppliers/${f.supplier}`,
    args: (f) => [prev, { id: f.supplier, notes: "Matrix (action)" }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/purchasing/purchasing-actions.ts#cancelPurchaseOrderAction": {
    page: (f) => `/purchasing/orders/${f.doomedPurchaseOrder}`,
    // The route's row cancelled it first (version 2): the owner's call is then a 422.
    args: (f) => [prev, { id: f.doomedPurchaseOrder, version: 2 }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/purchasing/purchasing-actions.ts#createPurchaseOrderAction": {
    page: () => "/purchasing",
    args: (f) => [prev, { supplierId: f.supplier, lines: [{ partId: f.part, quantity: 1 }] }],
    expect: "401 ok 403 ok 403 422",
  },
  "lib/purchasing/purchasing-actions.ts#sendPurchaseOrderAction": {
    page: (f) => `/purchasing/orders/${f.purchaseOrder}`,
    args: (f) => [prev, { id: f.purchaseOrder }],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/purchasing/purchasing-actions.ts#receivePurchaseOrderAction": {
    page: (f) => `/purchasing/orders/${f.purchaseOrder}`,
    args: (f) => [
      prev,
      { id: f.purchaseOrder, lines: [{ lineId: f.purchaseOrderLine, quantity: 1 }] },
    ],
    expect: "401 ok 403 ok 403 404",
  },
  "lib/notices/notice-actions.ts#retryNoticeAction": {
    page: (f) => `/invoices/${f.invoice}`,
    args: (f) => [prev, { id: f.mail }],
    expect: "401 ok ok ok 403 404",
  },
  "lib/notices/notice-actions.ts#setShopNoticesAction": {
    page: () => "/settings",
    args: () => [prev, { on: false }],
    expect: "401 ok ok ok 403 ok",
  },
  "lib/preferences/preference-actions.ts#setUnitsAction": {
    page: (f) => `/builds/${f.build}`,
    args: () => [prev, formOf({ units: "metric" })],
    expect: "401 ok ok ok 403 ok",
  },
  "lib/shares/share-actions.ts#createShareLinkAction": {
    page: (f) => `/builds/${f.build}`,
    args: (f) => [prev, { buildId: f.build, days: 1 }],
    expect: "401 ok ok ok 403 404",
  },
  "lib/shares/share-actions.ts#revokeShareLinkAction": {
    page: (f) => `/builds/${f.build}`,
    args: (f) => [prev, { id: f.share }],
    expect: "401 ok ok ok 403 404",
  },
  // Public by design: signing up and accepting an invitation check their own inputs.
  "app/(auth)/actions.ts#signUpAction": {
    page: () => "/sign-up",
    args: () => [prev, formOf({})],
    expect: "ok ok ok ok ok ok",
  },
  "app/(auth)/actions.ts#acceptInvitationAction": {
    page: () => "/accept-invitation/00000000-0000-4000-8000-00000000abcd",
    args: () => [prev, formOf({ invitationId: "00000000-0000-4000-8000-00000000abcd" })],
    expect: "ok ok ok ok ok ok",
    mayVanish: true,
  },
  "app/(auth)/actions.ts#acceptAsSignedInAction": {
    page: () => "/accept-invitation/00000000-0000-4000-8000-00000000abcd",
    args: () => ["00000000-0000-4000-8000-00000000abcd"],
    expect: "ok ok ok ok ok ok",
    mayVanish: true,
  },
};

/** Fresh fixtures in the demo shop, made by its staff. */
export async function makeFixtures(c: { tuner: Client; counter: Client }): Promise<Fx> {
  const { tuner, counter } = c;
  const [demo] =
    await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
  const portalCustomer = demo!.customer_id as string; // linked to the demo customer's sign-in
  const made = await request(tuner, "POST", "/api/v1/builds", {
    customerId: portalCustomer,
    title: "Access matrix build",
    inputs: demo!.inputs,
  });
  const build = made.json.build.id as string;
  const doomed = await request(counter, "POST", "/api/v1/customers", {
    name: "Access matrix doomed customer",
  });
  // The one the customer routes and actions edit: never a shared demo record.
  const own = await request(counter, "POST", "/api/v1/customers", {
    name: "Access matrix customer",
    email: `matrix-${Date.now().toString(36)}@example.test`,
    vehicles: [
      { year: 2012, make: "Matrixware", model: "Edited" },
      { year: 2013, make: "Matrixware", model: "Doomed" },
    ],
  });
  const quote = await request(counter, "POST", "/api/v1/quotes", { buildId: build });
  const [part] =
    await sql`select id from parts where shop_id = 'demo-shop-ridgeback' order by sku limit 1`;
  const doomedSku = `MX-${Date.now().toString(36)}`;
  const [doomedPart] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor) values ('demo-shop-ridgeback', ${doomedSku}, 'fitting', 'Matrixware', 'Access matrix doomed part', 100) returning id`;
  const log = await fetch(`${BASE_URL}/api/v1/builds/${build}/datalogs`, {
    method: "POST",
    body: "rpm,duty\n3000,40\n3100,41\n",
    headers: {
      cookie: tuner.cookie,
      "x-forwarded-for": tuner.ip,
      origin: BASE_URL,
      "content-type": "text/csv",
      "x-file-name": "matrix.csv",
    },
  });
  const addPull = () =>
    fetch(`${BASE_URL}/api/v1/builds/${build}/tune/pulls?ethanolPct=85&powerMeasuredAt=crank`, {
      method: "POST",
      body: "rpm,duty\n3000,40\n3100,41\n",
      headers: {
        cookie: tuner.cookie,
        "x-forwarded-for": tuner.ip,
        origin: BASE_URL,
        "content-type": "text/csv",
        "x-file-name": "matrix pull.csv",
      },
    });
  const pull = await addPull();
  const doomedPull = await addPull();
  const share = await request(tuner, "POST", `/api/v1/builds/${build}/share-links`, { days: 1 });
  expect(
    [
      made.status,
      doomed.status,
      own.status,
      quote.status,
      log.status,
      pull.status,
      doomedPull.status,
      share.status,
    ],
    "fixtures",
  ).toEqual([201, 201, 201, 201, 201, 201, 201, 201]);
  const ops = await operationsFixtures(counter, tuner, portalCustomer, part!.id as string);
  return {
    ...ops,
    build,
    customer: own.json.customer.id,
    vehicle: own.json.customer.vehicles[0].id,
    doomedVehicle: own.json.customer.vehicles[1].id,
    doomedCustomer: doomed.json.customer.id,
    part: part!.id,
    doomedPart: doomedPart!.id,
    doomedSku,
    quote: quote.json.quote.id,
    datalog: (await log.json()).datalog.id,
    pull: (await pull.json()).pull.id,
    doomedPull: (await doomedPull.json()).pull.id,
    share: share.json.link.id,
    inputs: demo!.inputs,
    portalCustomer,
  };
}

/**
 * Suppliers, a purchase order, a paid quote, jobs (one fitted and invoiced, one ready) and an
 * issued invoice of the portal customer, made through the API.
 */
async function operationsFixtures(
  counter: Client,
  tuner: Client,
  portalCustomer: string,
  part: string,
) {
  const stamp = Date.now().toString(36);
  const supplier = await request(counter, "POST", "/api/v1/suppliers", {
    name: `Matrix supply ${stamp}`,
    email: `matrix-supply-${stamp}@example.test`,
    parts: [{ partId: part, supplierSku: "MX-1", costMinor: 100 }],
  });
  const doomedSupplier = await request(counter, "POST", "/api/v1/suppliers", {
    name: `Matrix doomed supply ${stamp}`,
  });
  const po = await request(counter, "POST", "/api/v1/purchase-orders", {
    supplierId: supplier.json.supplier.id,
    lines: [{ partId: part, quantity: 1000 }],
  });
  const doomedPo = await request(counter, "POST", "/api/v1/purchase-orders", {
    supplierId: supplier.json.supplier.id,
    lines: [{ partId: part, quantity: 1 }],
  });
  /** A quote of the portal customer with one labour line, its deposit recorded paid. */
  const paidQuote = async () => {
    const q = await request(counter, "POST", "/api/v1/quotes", { customerId: portalCustomer });
    await request(counter, "PATCH", `/api/v1/quotes/${q.json.quote.id}`, {
      version: 1,
      validUntil: "2099-01-31",
      lines: [
        {
          kind: "labour",
          description: "Matrix labour",
          quantityMilli: 1000,
          unitPriceMinor: 10000,
          discountBp: 0,
        },
      ],
    });
    await sql`update quotes set status = 'deposit_paid', accepted_at = now() where id = ${q.json.quote.id}`;
    return q.json.quote.id as string;
  };
  const [forJob, forReady, open] = [await paidQuote(), await paidQuote(), await paidQuote()];
  const job = await request(counter, "POST", "/api/v1/jobs", { quoteId: forJob });
  const ready = await request(counter, "POST", "/api/v1/jobs", { quoteId: forReady });
  const fitted = await request(tuner, "POST", `/api/v1/jobs/${job.json.job.id}/fit`, {
    version: job.json.job.version,
    parts: [],
    labourMilli: 1000,
  });
  const inv = await request(counter, "POST", "/api/v1/invoices", { jobId: job.json.job.id });
  const issued = await request(counter, "POST", `/api/v1/invoices/${inv.json.invoice?.id}/issue`, {
    version: inv.json.invoice?.version,
  });
  expect(
    [
      supplier.status,
      doomedSupplier.status,
      po.status,
      doomedPo.status,
      job.status,
      ready.status,
      fitted.status,
      inv.status,
      issued.status,
    ],
    "operations fixtures",
  ).toEqual([201, 201, 201, 201, 201, 201, 200, 201, 200]);
  const [mail] =
    await sql`select id from mail_log where record_id = ${inv.json.invoice.id} limit 1`;
  return {
    supplier: supplier.json.supplier.id as string,
    doomedSupplier: doomedSupplier.json.supplier.id as string,
    purchaseOrder: po.json.purchaseOrder.po.id as string,
    purchaseOrderLine: po.json.purchaseOrder.lines[0].id as string,
    doomedPurchaseOrder: doomedPo.json.purchaseOrder.po.id as string,
    paidQuote: open,
    job: job.json.job.id as string,
    readyJob: ready.json.job.id as string,
    invoice: inv.json.invoice.id as string,
    mail: mail!.id as string,
  };
}
