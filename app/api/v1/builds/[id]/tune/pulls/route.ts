import { requireMember } from "@/lib/auth/member";
import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { addTunePull } from "@/lib/tune/tune-commands";
import { TunePullUploadSchema } from "@/lib/validations/tune";

const MAX_BYTES = 20 * 1024 * 1024;
const CSV_UPLOAD = {
  accepts: {
    types: ["text/csv", "text/plain", "application/vnd.ms-excel"],
    message: "Upload the pull's log as a CSV file (text/csv)",
  },
};

/** The `mapping` query parameter is JSON; text that is not JSON is left for the schema to refuse. */
function json(text: string | null): unknown {
  if (text === null) return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
}

/** How a message names the upload: `file "pull 3.csv"` (an empty file says which was chosen). */
function logName(fileName: string | null): string {
  const name = fileName?.replace(/["\\]/g, "").trim().slice(0, 120);
  return name ? `file "${name}"` : "log file";
}

/**
 * POST ?ethanolPct=85&boostTargetKpa=100&powerMeasuredAt=wheel&notes=…[&mapping={…}] with the
 * CSV as the body (`x-file-name` its name) — adds a pull to the build's tune session, last in
 * order. The log is placed by the mapping (sent, remembered for the logger, or guessed) and
 * measured before anything is stored; a log that cannot be placed is a 422 naming the column,
 * nothing stored → 201 `{ pull, cutShort }`.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("datalogs:upload");
  const buildId = await uuidParam(ctx, "That build");
  const q = new URL(req.url).searchParams;
  const input = TunePullUploadSchema.parse({
    buildId,
    ethanolPct: q.get("ethanolPct") ?? undefined,
    boostTargetKpa: q.get("boostTargetKpa") ?? undefined,
    powerMeasuredAt: q.get("powerMeasuredAt") ?? undefined,
    notes: q.get("notes") ?? undefined,
    mapping: json(q.get("mapping")),
    fileName: req.headers.get("x-file-name") ?? undefined,
    csv: await readText(req, MAX_BYTES, logName(req.headers.get("x-file-name"))),
  });
  return Response.json(await addTunePull(m, input), { status: 201 });
}, CSV_UPLOAD);
