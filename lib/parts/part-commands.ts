import "server-only";

import { isDeepStrictEqual } from "node:util";

import {
  importPartsWith,
  createPart as insertPart,
  partsBySku,
  deletePart as removePart,
  updatePartWith,
  type PartColumns,
  type PartPatch,
} from "@/db/queries/parts";
import type { Part } from "@/db/schema";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { parseCatalogCsv, type CsvRowError } from "@/lib/catalog/csv";
import { Invalid } from "@/lib/domain/errors";
import {
  checkSpecs,
  mergeSpecs,
  SPEC_KEYS,
  specKeysOfColumns,
  type PartUpdate,
  type PartValues,
} from "@/lib/validations/parts";

/**
 * The catalog's writes: one command per write. Each checks the member's permission first, works
 * in one transaction and throws domain errors only (lib/domain/errors).
 */

/** Adds a part; a SKU the shop has already → Conflict `duplicate_sku` on `sku`. */
export async function createPart(member: Member, input: PartValues): Promise<Part> {
  authorize(member, "parts:write");
  return insertPart(member.shopId, input);
}

/**
 * Changes the fields sent and nothing else. Spec columns sent are merged into the stored specs
 * (a spec key no sent column speaks for is kept: a form or file without `dead_time_ms` keeps the
 * table), and the merged specs are checked as a whole; a category change starts the specs afresh
 * from what was sent. With a `version`, only from that version (stale → Conflict with the part as
 * it is now); values equal to the stored ones change nothing. The answer is the part.
 */
export async function updatePart(member: Member, input: PartUpdate): Promise<Part> {
  authorize(member, "parts:write");
  return updatePartWith(member.shopId, input.id, input.version, (stored) => {
    const category = input.fields.category ?? stored.category;
    const fresh = category !== stored.category;
    const touchesSpecs = fresh || input.specs.covered.some((k) => SPEC_KEYS[category].includes(k));
    if (!touchesSpecs) return input.fields;
    const base = fresh ? {} : (stored.specs as Record<string, unknown>);
    const checked = checkSpecs(category, mergeSpecs(category, base, input.specs));
    if (!checked.ok) throw new Invalid("Some fields are not valid", checked.issues);
    return { ...input.fields, specs: checked.specs } satisfies PartPatch;
  });
}

export async function deletePart(member: Member, input: { id: string }): Promise<void> {
  authorize(member, "parts:write");
  await removePart(member.shopId, input.id);
}

export interface ImportPreviewRow {
  line: number;
  sku: string;
  name: string;
  brand: string;
  category: string;
  priceMinor: number;
  stock: number;
  /** "unchanged": the SKU is in the catalog and the row would change none of its columns. */
  action: "add" | "update" | "unchanged";
}
export interface CatalogImport {
  preview: ImportPreviewRow[];
  ignoredColumns: string[];
  /** Every bad row by line and column; when there is any, nothing was written. */
  errors: CsvRowError[];
  /** After a real (not dry) run without errors. */
  added?: number;
  updated?: number;
  unchanged?: number;
}

/** Column of the flat row → column of the part, for the columns a file may leave out. */
const FIELD_OF_COLUMN = {
  sku: "sku",
  category: "category",
  brand: "brand",
  name: "name",
  price: "priceMinor",
  cost: "costMinor",
  stock: "stock",
  reorder_level: "reorderLevel",
  lead_time_days: "leadTimeDays",
  restock_on: "restockOn",
} as const satisfies Record<string, keyof PartColumns>;

/** The columns an import writes (a known SKU whose row holds them all is left alone). */
const IMPORTED_COLUMNS = [
  "category",
  "brand",
  "name",
  "priceMinor",
  "costMinor",
  "stock",
  "reorderLevel",
  "leadTimeDays",
  "restockOn",
  "specs",
] as const satisfies (keyof PartColumns & keyof Part)[];

const sameColumns = (row: PartColumns, was: Part) =>
  IMPORTED_COLUMNS.every((c) => isDeepStrictEqual(row[c] ?? null, was[c] ?? null));

/**
 * Reads a catalog CSV and, unless `dryRun` or any row is bad, upserts every row by SKU in one
 * transaction. A SKU already in the catalog changes only in the columns the file has: a column
 * it lacks (cost, a spec, `dead_time_ms`) keeps its stored value; a row equal to the stored
 * part writes nothing (`unchanged`).
 */
export async function importCatalog(
  member: Member,
  input: { csv: string; dryRun: boolean },
): Promise<CatalogImport> {
  authorize(member, "parts:write");
  const parsed = parseCatalogCsv(input.csv);
  const fileFields = Object.entries(FIELD_OF_COLUMN)
    .filter(([col]) => parsed.columns.includes(col))
    .map(([, field]) => field);
  const covered = specKeysOfColumns(parsed.columns);
  // The row to write for each line: a known SKU is the stored part with the file's columns merged in.
  const merge = (stored: Map<string, Part>) =>
    parsed.rows.map(({ line, ...row }): PartColumns => {
      const was = stored.get(row.sku);
      if (!was) return row;
      const merged: PartColumns = {
        sku: was.sku,
        category: was.category,
        brand: was.brand,
        name: was.name,
        priceMinor: was.priceMinor,
        costMinor: was.costMinor,
        stock: was.stock,
        reorderLevel: was.reorderLevel,
        leadTimeDays: was.leadTimeDays,
        restockOn: was.restockOn,
        specs: was.specs as Record<string, unknown>,
      };
      for (const f of fileFields) Object.assign(merged, { [f]: row[f] });
      if (row.category !== was.category) return { ...merged, specs: row.specs };
      const specs = checkSpecs(
        row.category,
        mergeSpecs(row.category, merged.specs, { values: row.specs, covered }),
      );
      if (!specs.ok)
        throw new Invalid(
          `Line ${line}: with the stored data of ${row.sku} its specification is not valid`,
          specs.issues.map((i) => ({ path: `${line}.${i.path}`, message: i.message })),
          "invalid_rows",
        );
      return { ...merged, specs: specs.specs };
    });
  const skus = parsed.rows.map((r) => r.sku);
  const stored = await partsBySku(member.shopId, skus);
  // The preview says what the import would do: a row equal to the stored part is "unchanged".
  const rows = parsed.errors.length ? [] : merge(stored);
  const preview = parsed.rows.map((r, k): ImportPreviewRow => {
    const was = stored.get(r.sku);
    return {
      line: r.line,
      sku: r.sku,
      name: r.name,
      brand: r.brand,
      category: r.category,
      priceMinor: r.priceMinor,
      stock: r.stock,
      action: !was ? "add" : rows[k] && sameColumns(rows[k], was) ? "unchanged" : "update",
    };
  });
  const out = { preview, ignoredColumns: parsed.ignoredColumns, errors: parsed.errors };
  if (parsed.errors.length || input.dryRun) return out;
  const counts = await importPartsWith(member.shopId, skus, merge);
  return { ...out, ...counts };
}
