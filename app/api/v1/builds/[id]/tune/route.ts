import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { saveTuneLimits } from "@/lib/tune/tune-commands";
import { tuneSession } from "@/lib/tune/tune-session";
import { TuneLimitsSaveSchema, TuneSessionQuery } from "@/lib/validations/tune";

/**
 * GET ?nextBoostKpa=… or ?nextPowerKw=… (crank) or ?nextBy=boost|power — the build's tune session:
 * the limits in force (and whose), every pull in order with its points, summary and limit checks,
 * and the next step predicted from the last pull that logged power, with `basis` saying where its
 * target came from (`nextBy=boost`: exactly the build's boost target; `power`: its power target;
 * none asked: the build's target power, else 20 kPa more boost).
 */
export const GET = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("datalogs:read");
  const id = await uuidParam(ctx, "That build");
  const q = TuneSessionQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json(
    await tuneSession(m.shopId, id, {
      boostKpa: q.nextBoostKpa,
      crankKw: q.nextPowerKw,
      by: q.nextBy,
    }),
  );
});

/**
 * PATCH `{ limits, scope? }` — the build's own limits (`limits: null` goes back to the shop's);
 * `scope: "shop"` makes them the shop's defaults (owner) → `{ scope, limits }`.
 */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const buildId = await uuidParam(ctx, "That build");
  const input = TuneLimitsSaveSchema.parse({ ...((await readJson(req)) as object), buildId });
  return Response.json(await saveTuneLimits(m, input));
});
