import { getDatalog } from "@/db/queries/datalogs";
import { requireMember } from "@/lib/auth/member";
import { datalogDelimiter } from "@/lib/calc";
import { NotFound } from "@/lib/domain/errors";
import { neutraliseCsvText } from "@/lib/format/csv";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { getObject } from "@/lib/storage";

const BOM = "\xEF\xBB\xBF";

/**
 * The uploaded log as a spreadsheet may open it: every byte as uploaded, except that a cell a
 * spreadsheet would run as a formula gets a leading `'` (lib/format/csv.ts). Read byte for byte
 * (latin1), so whatever the file's encoding, only those apostrophes are added.
 */
function safeForSpreadsheets(bytes: Buffer): Buffer {
  const raw = bytes.toString("latin1");
  const bom = raw.startsWith(BOM) ? BOM : "";
  const text = raw.slice(bom.length);
  const safe = neutraliseCsvText(text, datalogDelimiter(text));
  return safe === text ? bytes : Buffer.from(bom + safe, "latin1");
}

/** GET — the uploaded datalog file itself, from object storage (the shop's own only). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("datalogs:read");
  const id = await uuidParam(ctx, "That datalog");
  const d = await getDatalog(m.shopId, id);
  if (!d) throw new NotFound("That datalog");
  const body = safeForSpreadsheets(await getObject(d.objectKey));
  return new Response(new Uint8Array(body), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${d.fileName}"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
