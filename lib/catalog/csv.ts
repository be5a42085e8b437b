import Papa from "papaparse";

import type { StoredPartFields } from "@/lib/catalog/flat-part";
import { neutraliseCell, undoNeutralisedCell } from "@/lib/format/csv";
import {
  CSV_COLUMNS,
  flatOf,
  FlatPartSchema,
  type FlatPart,
  type PartValues,
} from "@/lib/validations/parts";

export interface CsvRowError {
  line: number;
  field: string;
  message: string;
}
export interface ParsedCatalog {
  rows: (PartValues & { line: number })[];
  errors: CsvRowError[];
  ignoredColumns: string[];
  /** The known columns the file has: for a SKU already in the catalog, only these change. */
  columns: string[];
}

export const MAX_CSV_BYTES = 2 * 1024 * 1024;
export const MAX_CSV_ROWS = 5000;
const REQUIRED = ["sku", "category", "brand", "name", "price", "stock"] as const;

/**
 * Reads a catalog CSV (the columns of CSV_COLUMNS; header row first). Every bad row is reported
 * by its line and column; a SKU given twice is an error on its second line. Pure: no database.
 */
export function parseCatalogCsv(text: string): ParsedCatalog {
  const src = text.replace(/^\uFEFF/, "");
  const parsed = Papa.parse<string[]>(src, { header: false, skipEmptyLines: false, delimiter: "" });
  const table = parsed.data;
  const errors: CsvRowError[] = [];
  const header = (table[0] ?? []).map((h) =>
    h
      .trim()
      .toLowerCase()
      .replace(/[\s-]+/g, "_"),
  );
  const missing = REQUIRED.filter((c) => !header.includes(c));
  if (table.length === 0 || header.every((h) => h === ""))
    return {
      rows: [],
      errors: [
        {
          line: 1,
          field: "header",
          message: "The file is empty: the first line must name the columns",
        },
      ],
      ignoredColumns: [],
      columns: [],
    };
  if (missing.length)
    return {
      rows: [],
      errors: [
        {
          line: 1,
          field: "header",
          message: `Missing column${missing.length > 1 ? "s" : ""}: ${missing.join(", ")}`,
        },
      ],
      ignoredColumns: [],
      columns: [],
    };
  const known = new Set<string>(CSV_COLUMNS);
  const ignoredColumns = header.filter((h) => h && !known.has(h));
  const columns = CSV_COLUMNS.filter((c) => header.includes(c));
  const rows: ParsedCatalog["rows"] = [];
  const seen = new Map<string, number>();
  const dataRows = table.slice(1);
  if (dataRows.filter((r) => r.some((c) => c.trim() !== "")).length > MAX_CSV_ROWS) {
    return {
      rows: [],
      errors: [{ line: 1, field: "file", message: `At most ${MAX_CSV_ROWS} parts per file` }],
      ignoredColumns,
      columns,
    };
  }
  dataRows.forEach((cells, i) => {
    const line = i + 2;
    if (cells.every((c) => c.trim() === "")) return;
    const flat: FlatPart = {};
    header.forEach((h, k) => {
      // The `'` an export put before a formula-like cell comes off again (lib/format/csv.ts).
      if (known.has(h)) flat[h as keyof FlatPart] = undoNeutralisedCell(cells[k] ?? "");
    });
    const r = FlatPartSchema.safeParse(flat);
    if (!r.success) {
      for (const iss of r.error.issues)
        errors.push({ line, field: String(iss.path[0] ?? "row"), message: iss.message });
      return;
    }
    const key = r.data.sku.toLowerCase();
    const first = seen.get(key);
    if (first !== undefined) {
      errors.push({ line, field: "sku", message: `SKU ${r.data.sku} is already on line ${first}` });
      return;
    }
    seen.set(key, line);
    rows.push({ ...r.data, line });
  });
  return { rows, errors, ignoredColumns, columns };
}

/**
 * The catalog as CSV, with the same columns the import reads; a text cell a spreadsheet would
 * run as a formula starts with `'` (the import takes it off), numbers are left as they are.
 */
export function catalogCsv(parts: StoredPartFields[]): string {
  return Papa.unparse({
    fields: [...CSV_COLUMNS],
    data: parts.map((p) => {
      const flat = flatOf(p);
      return CSV_COLUMNS.map((c) => neutraliseCell(flat[c] ?? ""));
    }),
  });
}
