import { getBuild } from "@/db/queries/builds";
import { listDatalogs } from "@/db/queries/datalogs";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { uploadDatalog } from "@/lib/dyno/dyno-commands";
import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { DatalogUploadSchema } from "@/lib/validations/datalogs";

const MAX_BYTES = 20 * 1024 * 1024;
const CSV_UPLOAD = {
  accepts: {
    types: ["text/csv", "text/plain", "application/vnd.ms-excel"],
    message: "Upload the datalog as a CSV file (text/csv)",
  },
};

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
 * at most 20 MB, checked by parsing before anything is stored → 201 `{ datalog, cutShort }`.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  // The role is checked before 20 MB are read; the command checks it again.
  const m = await requireMember("datalogs:upload");
  const buildId = await uuidParam(ctx, "That build");
  const input = DatalogUploadSchema.parse({
    buildId,
    fileName: req.headers.get("x-file-name") ?? undefined,
    csv: await readText(req, MAX_BYTES, "datalog"),
  });
  return Response.json(await uploadDatalog(m, input), { status: 201 });
}, CSV_UPLOAD);
