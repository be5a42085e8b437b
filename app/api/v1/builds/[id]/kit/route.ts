import { ConflictError } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { chooseKit, kitFor } from "@/lib/catalog/service";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { KitChoiceSchema } from "@/lib/validations/kit";

/** GET — ranked catalog parts for the build, each with why it fits or not. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("parts:read");
  const { build, recommendation } = await kitFor(m.shopId, await uuidParam(ctx, "That build"));
  return Response.json({ buildVersion: build.version, chosen: build.parts, ...recommendation });
});

/** POST — writes the chosen parts into the build (a new revision) and sizes it with their data. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("kit:choose");
  const id = await uuidParam(ctx, "That build");
  const body = KitChoiceSchema.parse(await readJson(req));
  try {
    return Response.json({
      build: await chooseKit(m.shopId, m.user.id, id, body.version, body.parts),
    });
  } catch (e) {
    if (e instanceof ConflictError)
      return Response.json(
        { error: { code: e.code, message: e.message }, current: e.current },
        { status: 409 },
      );
    throw e;
  }
});
