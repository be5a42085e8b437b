import { ConflictError, getBuild, saveBuild } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { checkTransition, sizeForSave } from "@/lib/builds/service";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { BuildSaveSchema } from "@/lib/validations/builds";

type Ctx = IdCtx;
const idOf = (ctx: Ctx) => uuidParam(ctx, "That build");

export const GET = handle<Ctx>(async (_req, ctx) => {
  const m = await requireMember("builds:view");
  const row = await getBuild(
    m.shopId,
    await idOf(ctx),
    ownRecordsOnly(m.role) ? m.user.id : undefined,
  );
  if (!row) throw new NotFound("That build");
  return Response.json({ build: row.build, customerName: row.customerName });
});

/** PATCH with the `version` the edit started from; a stale version → 409 with the current build. */
export const PATCH = handle<Ctx>(async (req, ctx) => {
  const m = await requireMember("builds:write");
  const id = await idOf(ctx);
  const body = BuildSaveSchema.parse(await readJson(req));
  const row = await getBuild(m.shopId, id);
  if (!row) throw new NotFound("That build");
  checkTransition(row.build.status, body.status);
  const sized = sizeForSave(body.inputs);
  try {
    const build = await saveBuild(m.shopId, id, m.user.id, body.version, { ...body, ...sized });
    return Response.json({ build });
  } catch (e) {
    if (e instanceof ConflictError)
      return Response.json(
        { error: { code: e.code, message: e.message }, current: e.current },
        { status: 409 },
      );
    throw e;
  }
});
