import { getDatalog } from "@/db/queries/datalogs";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { getObject } from "@/lib/storage";

/** GET — the uploaded datalog file itself, from object storage (the shop's own only). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("datalogs:read");
  const id = await uuidParam(ctx, "That datalog");
  const d = await getDatalog(m.shopId, id);
  if (!d) throw new NotFound("That datalog");
  const body = await getObject(d.objectKey);
  return new Response(new Uint8Array(body), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${d.fileName}"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
