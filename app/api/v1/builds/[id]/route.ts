import { getBuild } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { saveBuild } from "@/lib/builds/build-commands";
import { buildData } from "@/lib/builds/build-data";
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
  return Response.json({ build: buildData(row.build), customerName: row.customerName });
});

/**
 * PATCH with the `version` the edit started from and the fields to change (others keep their
 * value) → `{ build }`; a stale version → 409 with the current build.
 */
export const PATCH = handle<Ctx>(async (req, ctx) => {
  const m = await requireMember();
  const input = BuildSaveSchema.parse({
    ...((await readJson(req)) as object),
    id: await idOf(ctx),
  });
  return Response.json(await saveBuild(m, input));
});
