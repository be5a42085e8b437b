import { listBuilds } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { createBuild, createDraftBuild } from "@/lib/builds/build-commands";
import { Invalid } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { BuildCreateSchema, BuildDraftSchema, BuildListQuery } from "@/lib/validations/builds";

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

/**
 * POST /api/v1/builds — a new build sheet for a customer (default inputs when none are sent;
 * owner and tuner), or, with `goal`, a draft from a caller's goal in "needs sizing" (the counter
 * too; `inputs` are the tuner's, so a draft takes none).
 */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const body = await readJson(req);
  if (body && typeof body === "object" && "goal" in body) {
    if ("inputs" in body)
      throw Invalid.field(
        "inputs",
        "A draft build takes the goal only; the sizing inputs are the tuner's",
      );
    return Response.json(await createDraftBuild(m, BuildDraftSchema.parse(body)), {
      status: 201,
    });
  }
  const input = BuildCreateSchema.parse(body);
  return Response.json(await createBuild(m, input), { status: 201 });
});
