import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { deleteTunePull, updateTunePull } from "@/lib/tune/tune-commands";
import { TunePullUpdateSchema } from "@/lib/validations/tune";

const idOf = (ctx: IdCtx) => uuidParam(ctx, "That pull");

/**
 * PATCH `{ ethanolPct?, boostTargetKpa?, powerMeasuredAt?, notes?, excluded? }` — changes only the
 * fields sent (a new fuel or power site measures the log again) → `{ pull }`.
 */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await idOf(ctx);
  const input = TunePullUpdateSchema.parse({ ...((await readJson(req)) as object), id });
  return Response.json(await updateTunePull(m, input));
});

/** DELETE — the pull and its log, 204; a log that verified the build stays: 409 `log_verified`. */
export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  await deleteTunePull(m, { id: await idOf(ctx) });
  return new Response(null, { status: 204 });
});
