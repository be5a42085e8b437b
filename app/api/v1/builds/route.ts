import { createBuild, listBuilds } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { newBuildInputs } from "@/lib/builds/defaults";
import { sizeForSave } from "@/lib/builds/service";
import { readJson } from "@/lib/http/errors";
import { handle } from "@/lib/http/handler";
import { BuildCreateSchema, BuildListQuery } from "@/lib/validations/builds";

/** GET /api/v1/builds?q=&status=&cursor=&limit= — the shop's builds, newest first. */
export const GET = handle(async (req) => {
  const m = await requireMember("builds:read");
  const q = BuildListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json(await listBuilds(m.shopId, q));
});

/** POST /api/v1/builds — a new build sheet for a customer (default inputs when none are sent). */
export const POST = handle(async (req) => {
  const m = await requireMember("builds:write");
  const body = BuildCreateSchema.parse(await readJson(req));
  const sized = sizeForSave(body.inputs ?? newBuildInputs());
  const build = await createBuild(m.shopId, m.user.id, { customerId: body.customerId, title: body.title, vehicle: body.vehicle, ...sized });
  return Response.json({ build }, { status: 201 });
});
