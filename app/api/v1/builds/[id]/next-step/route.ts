import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { copyAsNextPowerStep } from "@/lib/tune/tune-commands";
import { NextPowerStepSchema } from "@/lib/validations/tune";

/**
 * POST `{ powerKw, pullId? }` — "Copy as next power step": a new build from this one's inputs
 * with the new power target (measured where this build's is), linked back to it → 201 `{ build }`.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const buildId = await uuidParam(ctx, "That build");
  const input = NextPowerStepSchema.parse({ ...((await readJson(req)) as object), buildId });
  return Response.json(await copyAsNextPowerStep(m, input), { status: 201 });
});
