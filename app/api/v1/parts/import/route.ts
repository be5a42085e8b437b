import { requireMember } from "@/lib/auth/member";
import { MAX_CSV_BYTES } from "@/lib/catalog/csv";
import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { importCatalog } from "@/lib/parts/part-commands";

const CSV_UPLOAD = {
  accepts: {
    types: ["text/csv", "text/plain", "application/vnd.ms-excel", "application/octet-stream"],
    message: "Send the catalog as a CSV file (text/csv)",
  },
};

/**
 * POST /api/v1/parts/import[?dryRun=1] with the CSV as the body (a file upload, so it stays on
 * the API). Any bad row → 422 listing every row error by line and column (`error.rows`, and the
 * same as `error.issues` with `line.column` paths), and nothing is written; otherwise all rows
 * in one transaction.
 */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const dryRun = new URL(req.url).searchParams.get("dryRun") === "1";
  const csv = await readText(req, MAX_CSV_BYTES, "catalog file");
  const { errors, ...result } = await importCatalog(m, { csv, dryRun });
  if (errors.length) {
    return Response.json(
      {
        error: {
          code: "invalid_rows",
          message: `${errors.length} problem${errors.length > 1 ? "s" : ""} in the file; nothing was imported`,
          issues: errors.map((e) => ({ path: `${e.line}.${e.field}`, message: e.message })),
          rows: errors,
        },
        preview: result.preview,
        ignoredColumns: result.ignoredColumns,
      },
      { status: 422 },
    );
  }
  return Response.json(result);
}, CSV_UPLOAD);
