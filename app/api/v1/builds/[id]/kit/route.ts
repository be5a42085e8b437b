import { requireMember } from "@/lib/auth/member";
import { chooseKit } from "@/lib/builds/kit-commands";
import { kitForBuild } from "@/lib/builds/kit-recommendation";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { KitChoiceSchema } from "@/lib/validations/kit";

/** GET — ranked catalog parts for the build, each with why it fits or not. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("parts:read");
  const { build, recommendation } = await kitForBuild(m.shopId, await uuidParam(ctx, "That build"));
  return Response.json({ buildVersion: build.version, chosen: build.parts, ...recommendation });
});

/** POST — writes the chosen parts into the build (a new revision) and sizes it with their data. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const input = KitChoiceSchema.parse({
    ...((await readJson(req)) as object),
    id: await uuidParam(ctx, "That build"),
  });
  return Response.json(await chooseKit(m, input));
});
