// Reference: docs/calculations.md §6.
import Papa from "papaparse";

/** A datalog as columns of numbers: one header per column, optional units row, NaN-free. */
export interface Datalog {
  headers: string[];
  /** The units row under the headers, when the logger writes one ("rpm", "%", "kPa"…). */
  units: (string | null)[];
  /** Rows of numbers; a blank or non-numeric cell is null. Blank lines are dropped. */
  rows: (number | null)[][];
  delimiter: "," | ";" | "\t";
  decimalComma: boolean;
  /** The file stopped mid-row (an interrupted export or upload): that last, partial row was left out. */
  cutShort: boolean;
}

export class DatalogError extends Error {
  constructor(
    message: string,
    readonly line?: number,
  ) {
    super(message);
    this.name = "DatalogError";
  }
}

export const DATALOG_MAX_COLUMNS = 500;

const NUMBER = /^[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/;

function toNumber(cell: string, decimalComma: boolean): number | null {
  const t = cell.trim();
  if (!t || !NUMBER.test(t)) return null;
  const v = Number(decimalComma ? t.replace(",", ".") : t);
  return Number.isFinite(v) ? v : null;
}

/**
 * The separator of a log: whichever of comma, semicolon and tab splits its first line most.
 *
 * @example datalogDelimiter("rpm;afr\n3000;12,5\n") // ";"
 */
export function datalogDelimiter(text: string): Datalog["delimiter"] {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  const counts = {
    ",": firstLine.split(",").length,
    ";": firstLine.split(";").length,
    "\t": firstLine.split("\t").length,
  };
  return Object.entries(counts).sort((a, b) => b[1] - a[1])[0]![0] as Datalog["delimiter"];
}

/**
 * Reads an ECU or logger CSV: comma, semicolon or tab separated; decimal commas (with `;`);
 * a byte-order mark; a units row under the headers; blank lines. Throws DatalogError with a
 * plain message for what is not a datalog.
 */
export function parseDatalog(text: string): Datalog {
  const body = text.replace(/^\uFEFF/, "");
  if (!body.trim()) throw new DatalogError("The file is empty");
  if (body.includes("\u0000"))
    throw new DatalogError("The file is not text: upload the CSV the logger exported");
  const delimiter = datalogDelimiter(body);
  if (body.slice(0, body.search(/\r?\n|$/)).split(delimiter).length > DATALOG_MAX_COLUMNS)
    throw new DatalogError(`The log has more than ${DATALOG_MAX_COLUMNS} columns`);
  const parsed = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: "greedy" });
  const lines = parsed.data;
  if (lines.length < 2) throw new DatalogError("The log has a header but no data rows");
  const headers = lines[0]!.map((h, i) => h.trim() || `Column ${i + 1}`);
  if (headers.length < 2)
    throw new DatalogError("The log needs at least two columns (e.g. rpm and duty)");
  const sample = lines
    .slice(1, 50)
    .flat()
    .map((c) => c.trim())
    .filter(Boolean);
  const decimalComma = delimiter !== "," && sample.some((c) => /^[-+]?\d+,\d+$/.test(c));
  const numericShare = (row: string[]) =>
    row.filter((c) => toNumber(c, decimalComma) !== null).length /
    Math.max(1, row.filter((c) => c.trim()).length);
  let start = 1;
  let units: (string | null)[] = headers.map(() => null);
  if (lines[1] && numericShare(lines[1]) < 0.5) {
    units = headers.map((_, i) => lines[1]![i]?.trim() || null);
    start = 2;
  }
  // A file cut off mid-row ends without a newline on a row shorter than the headers: leave that row out.
  const cutShort =
    lines.length > start &&
    !/\r?\n\s*$/.test(body) &&
    lines[lines.length - 1]!.length < headers.length;
  const end = cutShort ? lines.length - 1 : lines.length;
  if (cutShort && end <= start)
    throw new DatalogError(
      "The log is cut short: its only data row is incomplete. Export it again",
    );
  const rows: (number | null)[][] = [];
  for (let i = start; i < end; i++) {
    const cells = lines[i]!;
    if (cells.length > DATALOG_MAX_COLUMNS)
      throw new DatalogError(`Line ${i + 1} has more than ${DATALOG_MAX_COLUMNS} columns`, i + 1);
    rows.push(headers.map((_, c) => toNumber(cells[c] ?? "", decimalComma)));
  }
  if (!rows.some((r) => r.some((v) => v !== null)))
    throw new DatalogError("No numbers were found under the headers");
  return { headers, units, rows, delimiter, decimalComma, cutShort };
}
