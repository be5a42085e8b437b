import { listParts } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { catalogCsv } from "@/lib/catalog/csv";
import { handle } from "@/lib/http/handler";

/** GET /api/v1/parts/export — the catalog as CSV, in the columns the import reads. */
export const GET = handle(async () => {
  const m = await requireMember("parts:read");
  const csv = catalogCsv(await listParts(m.shopId, { sort: "sku", limit: 100000 }));
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="catalog-${new Date().toISOString().slice(0, 10)}.csv"`,
    },
  });
});
