import { relations, sql } from "drizzle-orm";
import {
  boolean,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  real,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  type AnyPgColumn,
} from "drizzle-orm/pg-core";

import type {
  DatalogMapping,
  FuelSystemResult,
  ParsedFuelSystemInput,
  PowerMeasuredAt,
  TuneLimitsOverride,
  TunePoint,
  TunePullSummary,
  Warning,
} from "@/lib/calc";
import { BUILD_STATUSES, type ChosenPart } from "@/lib/domain/builds";
import type { SizingSettings } from "@/lib/sizing/effective-inputs";

import { organization, user } from "./auth";
import { customers, vehicles } from "./shops";

/** A customer's build sheet: the validated sizing inputs and the last result computed from them. */
export const builds = pgTable(
  "builds",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "restrict" }),
    title: text("title").notNull(),
    /** The vehicle as words (kept for the search); `vehicle_id` names the customer's vehicle record. */
    vehicle: text("vehicle"),
    vehicleId: uuid("vehicle_id").references(() => vehicles.id, { onDelete: "set null" }),
    status: text("status", { enum: BUILD_STATUSES }).notNull().default("draft"),
    /**
     * The validated inputs, written at lib/builds/stored-inputs.ts#INPUTS_SCHEMA_VERSION (noted in
     * `inputs_schema_version`). Read them only through `readStoredInputs`, which upgrades older ones.
     */
    inputs: jsonb("inputs").$type<ParsedFuelSystemInput>().notNull(),
    inputsSchemaVersion: integer("inputs_schema_version").notNull().default(1),
    result: jsonb("result").$type<FuelSystemResult>(),
    calcVersion: text("calc_version"),
    /**
     * The shop settings the result was sized with (lib/sizing/effective-inputs#SizingSettings);
     * null: sized before shop settings reached the sizing, i.e. with the library's defaults.
     */
    sizingSettings: jsonb("sizing_settings").$type<SizingSettings>(),
    /** Parts chosen from the catalog: [{ role, partId, sku, name, quantity }]. */
    parts: jsonb("parts").$type<ChosenPart[]>().notNull().default([]),
    /**
     * The inputs as they stood before the kit wrote chosen parts into them (with their format
     * version): what the kit ranks against, so its ranking does not move after "Use these parts".
     * Set by the first kit choice, kept by later ones; a save that changes the inputs otherwise
     * clears it (those inputs are then the basis). Null: rank against `inputs`.
     */
    kitBasis: jsonb("kit_basis").$type<{ inputs: unknown; inputsSchemaVersion: number }>(),
    /** Optimistic concurrency: every save must name the version it started from. */
    version: integer("version").notNull().default(1),
    /** Lower-cased title, vehicle and customer name, for the trigram search of the builds table. */
    searchText: text("search_text").notNull().default(""),
    /** "Copy as next power step": the build (step) this one was copied from. */
    previousStepId: uuid("previous_step_id").references((): AnyPgColumn => builds.id, {
      onDelete: "set null",
    }),
    /** The tuner responsible for the build (the creator unless reassigned). */
    tunerId: text("tuner_id").references(() => user.id, { onDelete: "set null" }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("builds_shop_updated_idx").on(t.shopId, t.updatedAt, t.id),
    index("builds_shop_status_updated_idx").on(t.shopId, t.status, t.updatedAt, t.id),
    index("builds_shop_created_idx").on(t.shopId, t.createdAt, t.id),
    index("builds_shop_title_idx").on(t.shopId, t.title, t.id),
    index("builds_shop_tuner_idx").on(t.shopId, t.tunerId, t.updatedAt, t.id),
    index("builds_search_trgm_idx").using("gin", sql`${t.searchText} gin_trgm_ops`),
    index("builds_shop_customer_idx").on(t.shopId, t.customerId),
    index("builds_shop_vehicle_idx").on(t.shopId, t.vehicleId),
  ],
);

/** Every save of a build, in order. */
export const buildRevisions = pgTable(
  "build_revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    buildId: uuid("build_id")
      .notNull()
      .references(() => builds.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    status: text("status", { enum: BUILD_STATUSES }).notNull(),
    /** As on `builds`: read through `readStoredInputs`. */
    inputs: jsonb("inputs").$type<ParsedFuelSystemInput>().notNull(),
    inputsSchemaVersion: integer("inputs_schema_version").notNull().default(1),
    result: jsonb("result").$type<FuelSystemResult>(),
    calcVersion: text("calc_version"),
    /** As on `builds`: read through `storedSizingSettings`; never changes once written. */
    sizingSettings: jsonb("sizing_settings").$type<SizingSettings>(),
    parts: jsonb("parts").$type<ChosenPart[]>().notNull().default([]),
    note: text("note"),
    authorId: text("author_id").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("build_revisions_build_version_idx").on(t.buildId, t.version),
    index("build_revisions_shop_idx").on(t.shopId),
  ],
);

export const buildRelations = relations(builds, ({ one, many }) => ({
  customer: one(customers, { fields: [builds.customerId], references: [customers.id] }),
  revisions: many(buildRevisions),
}));
export const buildRevisionRelations = relations(buildRevisions, ({ one }) => ({
  build: one(builds, { fields: [buildRevisions.buildId], references: [builds.id] }),
}));

export type Build = typeof builds.$inferSelect;
export type BuildRevision = typeof buildRevisions.$inferSelect;

/** A dyno datalog uploaded to a build: the file is in object storage, its facts here. */
export const datalogs = pgTable(
  "datalogs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    buildId: uuid("build_id")
      .notNull()
      .references(() => builds.id, { onDelete: "cascade" }),
    objectKey: text("object_key").notNull(),
    fileName: text("file_name").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256").notNull(),
    headers: jsonb("headers").$type<string[]>().notNull(),
    rowCount: integer("row_count").notNull(),
    /** The column mapping last used to analyse it, and that analysis (lib/calc analyzePull). */
    mapping: jsonb("mapping"),
    analysis: jsonb("analysis"),
    /** Set when this log verified its build. */
    verifiedAt: timestamp("verified_at", { withTimezone: true }),
    verifiedBy: text("verified_by").references(() => user.id, { onDelete: "set null" }),
    uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
    uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("datalogs_build_idx").on(t.shopId, t.buildId, t.uploadedAt)],
);
export type DatalogRow = typeof datalogs.$inferSelect;

/** A shop's remembered column mapping per logger, keyed by the log's header set (lib/calc headerKey). */
export const datalogMappings = pgTable(
  "datalog_mappings",
  {
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    headerKey: text("header_key").notNull(),
    mapping: jsonb("mapping").notNull(),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.headerKey] })],
);

/**
 * A build's tune session: its own limits, only the fields it sets apart (null or a field left
 * out: the shop's, shop_settings.tune_limits).
 */
export const tuneSessions = pgTable(
  "tune_sessions",
  {
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    buildId: uuid("build_id")
      .notNull()
      .references(() => builds.id, { onDelete: "cascade" }),
    limits: jsonb("limits").$type<TuneLimitsOverride>(),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.buildId] })],
);

/**
 * One pull of a build's tune session, in order (`position`): its fuel, boost target, notes and
 * log (a datalog of the build), where the dyno measured power, and what the pull measured —
 * points in canonical units with power at the crank (lib/calc/tune preparePull), the summary and
 * the notes on what was done to the log. Limits are judged when read (they can change).
 */
export const tunePulls = pgTable(
  "tune_pulls",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    buildId: uuid("build_id")
      .notNull()
      .references(() => builds.id, { onDelete: "cascade" }),
    datalogId: uuid("datalog_id")
      .notNull()
      .references(() => datalogs.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    ethanolPct: real("ethanol_pct").notNull(),
    /** Boost asked of this pull, kPa gauge; null: not stated (naturally aspirated, or unknown). */
    boostTargetKpa: real("boost_target_kpa"),
    notes: text("notes").notNull().default(""),
    powerMeasuredAt: text("power_measured_at", { enum: ["crank", "wheel", "hub"] })
      .$type<PowerMeasuredAt>()
      .notNull(),
    /** The drivetrain loss the power was carried to the crank with (the build's, when uploaded). */
    drivetrainLossPct: real("drivetrain_loss_pct").notNull(),
    excluded: boolean("excluded").notNull().default(false),
    mapping: jsonb("mapping").$type<DatalogMapping>().notNull(),
    points: jsonb("points").$type<TunePoint[]>().notNull(),
    summary: jsonb("summary").$type<TunePullSummary>().notNull(),
    logNotes: jsonb("log_notes").$type<Warning[]>().notNull().default([]),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("tune_pulls_build_idx").on(t.shopId, t.buildId, t.position),
    uniqueIndex("tune_pulls_datalog_idx").on(t.datalogId),
  ],
);
export type TunePullRow = typeof tunePulls.$inferSelect;
