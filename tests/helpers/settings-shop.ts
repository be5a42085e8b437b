import { randomUUID } from "node:crypto";

import { expect } from "vitest";

import { DEFAULT_BSFC } from "@/lib/calc";
import type { ShopSizingColumns } from "@/lib/sizing/effective-inputs";

import { makeOtherShop, sql } from "./db";
import { request, signIn, type Client } from "./http";

/**
 * A shop of its own whose every setting differs from a new shop's, for the tests that follow
 * each setting to the figures, screens and documents it should reach. The values are inputs
 * (chosen to differ), not check values.
 */
export const CHANGED_SETTINGS = {
  shopName: "Kestrel Fuel Works",
  currency: "EUR",
  taxRatePct: 19,
  units: "metric",
  address: "2 Kestrel Yard, Harbourside",
  phone: "555-0177",
  paperSize: "a4",
  timeZone: "Pacific/Auckland",
  bsfcGasolineNa: 310,
  bsfcGasolineBoosted: 370,
  bsfcE85Na: 430,
  bsfcE85Boosted: 520,
  designDutyPct: 75,
  dutyCautionPct: 75,
  dutyDangerPct: 88,
  minPumpMarginPct: 40,
  maxLineDropKpa: 10,
  lossManualPct: 11,
  lossAutomaticPct: 18,
  lossAwdPct: 24,
  gasolineDensityKgPerL: 0.74,
  gasolineStoichAfr: 14.6,
  ethanolDensityKgPerL: 0.785,
  ethanolStoichAfr: 8.95,
  labourRate: 95.5,
  depositPct: 35,
  quoteValidDays: 21,
} as const;

/** What a new shop starts with (db/schema/shops.ts defaults and db/queries/shops.ts NEW_SHOP_SETTINGS). */
export const NEW_SHOP_COLUMNS: ShopSizingColumns = {
  designDutyPct: 80,
  dutyCautionPct: 80,
  dutyDangerPct: 90,
  minPumpMarginPct: 25,
  maxLineDropKpa: 14,
  bsfcGasolineNa: DEFAULT_BSFC.gasolineNaGPerKwh,
  bsfcGasolineBoosted: DEFAULT_BSFC.gasolineBoostedGPerKwh,
  bsfcE85Na: DEFAULT_BSFC.e85NaGPerKwh,
  bsfcE85Boosted: DEFAULT_BSFC.e85BoostedGPerKwh,
  lossManualPct: 12,
  lossAutomaticPct: 17,
  lossAwdPct: 22,
  gasolineDensityKgPerL: null,
  gasolineStoichAfr: null,
  ethanolDensityKgPerL: null,
  ethanolStoichAfr: null,
};

/** The shop's sizing columns as stored (BSFC is a `real`: single precision, as the app reads it). */
export async function storedColumns(shopId: string): Promise<ShopSizingColumns> {
  const [r] = await sql`select * from shop_settings where shop_id = ${shopId}`;
  const camel = (k: string) => k.replace(/_(\w)/g, (_m, c: string) => c.toUpperCase());
  const row = Object.fromEntries(Object.entries(r!).map(([k, v]) => [camel(k), v]));
  return Object.fromEntries(
    Object.keys(NEW_SHOP_COLUMNS).map((k) => [k, row[k]]),
  ) as unknown as ShopSizingColumns;
}

/** The sizing columns of CHANGED_SETTINGS. */
export const CHANGED_COLUMNS: ShopSizingColumns = Object.fromEntries(
  Object.keys(NEW_SHOP_COLUMNS).map((k) => [
    k,
    CHANGED_SETTINGS[k as keyof typeof CHANGED_SETTINGS],
  ]),
) as unknown as ShopSizingColumns;

/** A fresh shop with its owner signed in and a customer with an e-mail address. */
export async function makeSettingsShop(): Promise<{
  shopId: string;
  owner: Client;
  customerId: string;
  customerEmail: string;
}> {
  const shop = await makeOtherShop(`settings-${randomUUID().slice(0, 8)}`);
  // A new shop's BSFC rules of thumb (makeOtherShop writes rounded ones).
  await sql`update shop_settings set bsfc_gasoline_na = ${NEW_SHOP_COLUMNS.bsfcGasolineNa},
    bsfc_gasoline_boosted = ${NEW_SHOP_COLUMNS.bsfcGasolineBoosted},
    bsfc_e85_na = ${NEW_SHOP_COLUMNS.bsfcE85Na}, bsfc_e85_boosted = ${NEW_SHOP_COLUMNS.bsfcE85Boosted}
    where shop_id = ${shop.shopId}`;
  const owner = await signIn(shop.email, shop.password);
  const customerEmail = `settings-customer-${randomUUID().slice(0, 8)}@example.test`;
  const c = await request(owner, "POST", "/api/v1/customers", {
    name: "Settings Customer",
    email: customerEmail,
  });
  expect(c.status, "customer made").toBe(201);
  return { shopId: shop.shopId, owner, customerId: c.json.customer.id, customerEmail };
}
