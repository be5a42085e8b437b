import { getBuild } from "@/db/queries/builds";
import { listShareLinks } from "@/db/queries/shares";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { createShareLink } from "@/lib/shares/share-commands";
import { ShareLinkDaysSchema } from "@/lib/validations/shares";

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("shares:manage");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id))) throw new NotFound("That build");
  return Response.json({ links: await listShareLinks(m.shopId, id) });
});

/** POST { days } — a new expiring link to the build's spec sheet; the URL is shown once. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const buildId = await uuidParam(ctx, "That build");
  const { days } = ShareLinkDaysSchema.parse(await readJson(req));
  return Response.json(await createShareLink(m, { buildId, days }), { status: 201 });
});
