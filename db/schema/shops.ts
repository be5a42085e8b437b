import { relations } from "drizzle-orm";
import {
  customType,
  index,
  integer,
  jsonb,
  pgTable,
  real,
  text,
  timestamp,
  uuid,
} from "drizzle-orm/pg-core";

import type { TuneLimits } from "@/lib/calc";
import { PAPER_SIZES } from "@/lib/domain/documents";

import { organization, user } from "./auth";

/** A shop's defaults. One row per shop (organization). BSFC in g/kWh, pressures in kPa. */
export const shopSettings = pgTable("shop_settings", {
  shopId: text("shop_id")
    .primaryKey()
    .references(() => organization.id, { onDelete: "cascade" }),
  currency: text("currency").notNull().default("USD"),
  /** Tax rate in basis points (825 = 8.25 %). */
  taxRateBp: integer("tax_rate_bp").notNull().default(0),
  /** Labour rate per hour in minor units, for the labour line of a new quote. */
  labourRateMinor: integer("labour_rate_minor").notNull().default(12000),
  /** Deposit asked on an accepted quote, in basis points of the total (3000 = 30 %). */
  depositBp: integer("deposit_bp").notNull().default(3000),
  /** Days a new quote stays valid. */
  quoteValidDays: integer("quote_valid_days").notNull().default(30),
  units: text("units", { enum: ["metric", "imperial"] })
    .notNull()
    .default("imperial"),
  /**
   * ISO 3166-1 alpha-2: the default country of customers' phone numbers and addresses, and
   * whether customers carry a tax id (lib/domain/countries.ts).
   */
  country: text("country").notNull().default("US"),
  address: text("address"),
  phone: text("phone"),
  bsfcGasolineNa: real("bsfc_gasoline_na").notNull(),
  bsfcGasolineBoosted: real("bsfc_gasoline_boosted").notNull(),
  bsfcE85Na: real("bsfc_e85_na").notNull(),
  bsfcE85Boosted: real("bsfc_e85_boosted").notNull(),
  designDutyPct: real("design_duty_pct").notNull().default(80),
  dutyCautionPct: real("duty_caution_pct").notNull().default(80),
  dutyDangerPct: real("duty_danger_pct").notNull().default(90),
  minPumpMarginPct: real("min_pump_margin_pct").notNull().default(25),
  maxLineDropKpa: real("max_line_drop_kpa").notNull().default(14),
  lossManualPct: real("loss_manual_pct").notNull().default(12),
  lossAutomaticPct: real("loss_automatic_pct").notNull().default(17),
  lossAwdPct: real("loss_awd_pct").notNull().default(22),
  /** Fuel component properties the shop measures or buys to (null: the library's, lib/calc/constants). */
  gasolineDensityKgPerL: real("gasoline_density_kg_per_l"),
  gasolineStoichAfr: real("gasoline_stoich_afr"),
  ethanolDensityKgPerL: real("ethanol_density_kg_per_l"),
  ethanolStoichAfr: real("ethanol_stoich_afr"),
  /** Default limits of every build's tune session (lib/calc TuneLimits); null: the library's. */
  tuneLimits: jsonb("tune_limits").$type<TuneLimits>(),
  /** Paper of every PDF the shop makes. */
  paperSize: text("paper_size", { enum: PAPER_SIZES }).notNull().default("letter"),
  /** IANA zone of every date a person reads in the shop's documents and e-mails. */
  timeZone: text("time_zone").notNull().default("UTC"),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

export const customers = pgTable(
  "customers",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    email: text("email"),
    /** E.164 (+12015550123) when it could be read as a number (lib/format/phone.ts), else as typed. */
    phone: text("phone"),
    notes: text("notes"),
    addressLine1: text("address_line1"),
    addressLine2: text("address_line2"),
    city: text("city"),
    region: text("region"),
    postcode: text("postcode"),
    /** ISO 3166-1 alpha-2; null: the shop's country. */
    country: text("country"),
    /** VAT, GST or business number, where the shop's country uses one (lib/domain/countries.ts). */
    taxId: text("tax_id"),
    /** The portal sign-in of this customer, once invited. */
    userId: text("user_id").references(() => user.id, { onDelete: "set null" }),
    /** Goes up with each saved edit; an edit names the version it started from (stale → 409). */
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("customers_shop_id_idx").on(t.shopId),
    index("customers_shop_name_idx").on(t.shopId, t.name),
    index("customers_user_id_idx").on(t.userId),
  ],
);

/** A customer's vehicle; builds may name one (builds.vehicle_id). */
export const vehicles = pgTable(
  "vehicles",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "cascade" }),
    year: integer("year").notNull(),
    make: text("make").notNull(),
    model: text("model").notNull(),
    engine: text("engine"),
    /** Upper case, checked when given (lib/domain/vin.ts). */
    vin: text("vin"),
    notes: text("notes"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("vehicles_shop_customer_idx").on(t.shopId, t.customerId),
    index("vehicles_shop_vin_idx").on(t.shopId, t.vin),
  ],
);

export const shopSettingsRelations = relations(shopSettings, ({ one }) => ({
  shop: one(organization, { fields: [shopSettings.shopId], references: [organization.id] }),
}));
export const customerRelations = relations(customers, ({ one, many }) => ({
  shop: one(organization, { fields: [customers.shopId], references: [organization.id] }),
  vehicles: many(vehicles),
}));
export const vehicleRelations = relations(vehicles, ({ one }) => ({
  customer: one(customers, { fields: [vehicles.customerId], references: [customers.id] }),
}));

export type ShopSettings = typeof shopSettings.$inferSelect;

/**
 * The settings columns the sizing reads (`lib/sizing/fill-inputs.ts#sizingSettingsOf`), named
 * once: the session look-up reads exactly these (db/queries/members.ts), and their type is the
 * row's own. A new sizing column goes here and reaches both.
 */
export const SHOP_SIZING_COLUMNS = [
  "designDutyPct",
  "dutyCautionPct",
  "dutyDangerPct",
  "minPumpMarginPct",
  "maxLineDropKpa",
  "bsfcGasolineNa",
  "bsfcGasolineBoosted",
  "bsfcE85Na",
  "bsfcE85Boosted",
  "lossManualPct",
  "lossAutomaticPct",
  "lossAwdPct",
  "gasolineDensityKgPerL",
  "gasolineStoichAfr",
  "ethanolDensityKgPerL",
  "ethanolStoichAfr",
] as const satisfies readonly (keyof ShopSettings)[];
export type ShopSizingColumns = Pick<ShopSettings, (typeof SHOP_SIZING_COLUMNS)[number]>;
export type Customer = typeof customers.$inferSelect;
export type Vehicle = typeof vehicles.$inferSelect;

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });

/** The shop's logo for its PDFs and pages: a small PNG or JPEG, checked by its bytes on upload. */
export const shopLogos = pgTable("shop_logos", {
  shopId: text("shop_id")
    .primaryKey()
    .references(() => organization.id, { onDelete: "cascade" }),
  contentType: text("content_type", { enum: ["image/png", "image/jpeg"] }).notNull(),
  bytes: bytea("bytes").notNull(),
  sha256: text("sha256").notNull(),
  width: integer("width").notNull(),
  height: integer("height").notNull(),
  uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
  uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
});
export type ShopLogo = typeof shopLogos.$inferSelect;
