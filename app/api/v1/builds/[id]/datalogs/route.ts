import { createHash, randomUUID } from "node:crypto";

import { getBuild } from "@/db/queries/builds";
import { listDatalogs, recordDatalog } from "@/db/queries/datalogs";
import { requireMember } from "@/lib/auth/member";
import { DatalogError, parseDatalog } from "@/lib/calc";
import { NotFound } from "@/lib/domain/errors";
import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { putObject } from "@/lib/storage";

const MAX_BYTES = 20 * 1024 * 1024;

/** GET — the build's uploaded datalogs (newest first). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("datalogs:read");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id))) throw new NotFound("That build");
  return Response.json({
    datalogs: (await listDatalogs(m.shopId, id)).map(({ objectKey: _k, ...d }) => d),
  });
});

/**
 * POST (the CSV itself as the body, `x-file-name` its name) — upload a dyno datalog: CSV only,
 * at most 20 MB, checked by parsing before anything is stored; the object, its name, size,
 * SHA-256 and uploader are recorded.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("datalogs:upload");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id))) throw new NotFound("That build");
  const type = (req.headers.get("content-type") ?? "").split(";")[0]!.trim().toLowerCase();
  if (!["text/csv", "text/plain", "application/vnd.ms-excel"].includes(type))
    throw new HttpError(415, "not_csv", "Upload the datalog as a CSV file (text/csv)");
  const text = await readText(req, MAX_BYTES, "datalog");
  let headers: string[];
  let rowCount: number;
  let cutShort: boolean;
  try {
    const log = parseDatalog(text);
    headers = log.headers;
    rowCount = log.rows.length;
    cutShort = log.cutShort;
  } catch (e) {
    if (e instanceof DatalogError) throw new HttpError(422, "bad_datalog", e.message);
    throw e;
  }
  const bytes = Buffer.from(text, "utf8");
  const fileName =
    (req.headers.get("x-file-name") ?? "datalog.csv").replace(/[^\w .()-]+/g, "_").slice(0, 120) ||
    "datalog.csv";
  const objectKey = `${m.shopId}/builds/${id}/datalogs/${randomUUID()}.csv`;
  await putObject(objectKey, bytes, "text/csv");
  const row = await recordDatalog({
    shopId: m.shopId,
    buildId: id,
    objectKey,
    fileName,
    sizeBytes: bytes.length,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    headers,
    rowCount,
    uploadedBy: m.user.id,
  });
  const { objectKey: _k, ...datalog } = row;
  // cutShort: the file stopped mid-row, and that partial last row was left out of the analysis.
  return Response.json({ datalog, cutShort }, { status: 201 });
});
