import { getPart } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { deletePart, updatePart } from "@/lib/parts/part-commands";
import { PartUpdateSchema } from "@/lib/validations/parts";

const idOf = (ctx: IdCtx) => uuidParam(ctx, "That part");

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("parts:read");
  const part = await getPart(m.shopId, await idOf(ctx));
  if (!part) throw new NotFound("That part");
  return Response.json({ part });
});

/** PATCH — changes only the fields sent (flat fields, as POST takes them); spec columns sent are merged. */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await idOf(ctx);
  const input = PartUpdateSchema.parse({ ...((await readJson(req)) as object), id });
  return Response.json({ part: await updatePart(m, input) });
});

export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  await deletePart(m, { id: await idOf(ctx) });
  return new Response(null, { status: 204 });
});
