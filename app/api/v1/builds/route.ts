import { listBuilds } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { createBuild } from "@/lib/builds/build-commands";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { BuildCreateSchema, BuildListQuery } from "@/lib/validations/builds";

/**
 * GET /api/v1/builds?q=&status=&tuner=&sort=&cursor=&limit= — the shop's builds (a customer's
 * own only, for the portal role).
 */
export const GET = handle(async (req) => {
  const m = await requireMember("builds:view");
  const { tuner, ...q } = BuildListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json(
    await listBuilds(m.shopId, {
      ...q,
      tunerId: tuner,
      portalUserId: ownRecordsOnly(m.role) ? m.user.id : undefined,
    }),
  );
});

/** POST /api/v1/builds — a new build sheet for a customer (default inputs when none are sent). */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = BuildCreateSchema.parse(await readJson(req));
  return Response.json(await createBuild(m, input), { status: 201 });
});
