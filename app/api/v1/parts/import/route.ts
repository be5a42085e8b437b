import { existingSkus, importParts } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { MAX_CSV_BYTES, parseCatalogCsv } from "@/lib/catalog/csv";
import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";

/**
 * POST /api/v1/parts/import[?dryRun=1] with the CSV as the body. Any bad row → 422 listing every
 * row error by line and column, and nothing is written; otherwise all rows in one transaction.
 */
export const POST = handle(async (req) => {
  const m = await requireMember("parts:write");
  const dryRun = new URL(req.url).searchParams.get("dryRun") === "1";
  const type = req.headers.get("content-type") ?? "";
  if (type && !/^(text\/(csv|plain)|application\/(vnd\.ms-excel|octet-stream))/i.test(type)) {
    return Response.json(
      { error: { code: "unsupported_type", message: "Send the catalog as a CSV file (text/csv)" } },
      { status: 415 },
    );
  }
  const parsed = parseCatalogCsv(await readText(req, MAX_CSV_BYTES, "catalog file"));
  const known = await existingSkus(
    m.shopId,
    parsed.rows.map((r) => r.sku),
  );
  const preview = parsed.rows.map((r) => ({
    line: r.line,
    sku: r.sku,
    name: r.name,
    brand: r.brand,
    category: r.category,
    priceMinor: r.priceMinor,
    stock: r.stock,
    action: known.has(r.sku.toLowerCase()) ? "update" : "add",
  }));
  if (parsed.errors.length) {
    return Response.json(
      {
        error: {
          code: "invalid_rows",
          message: `${parsed.errors.length} problem${parsed.errors.length > 1 ? "s" : ""} in the file; nothing was imported`,
          rows: parsed.errors,
        },
        preview,
        ignoredColumns: parsed.ignoredColumns,
      },
      { status: 422 },
    );
  }
  if (dryRun) return Response.json({ preview, ignoredColumns: parsed.ignoredColumns });
  const counts = await importParts(
    m.shopId,
    parsed.rows.map(({ line: _line, ...r }) => r),
  );
  return Response.json({ ...counts, preview, ignoredColumns: parsed.ignoredColumns });
});
