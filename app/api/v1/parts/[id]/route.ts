import { deletePart, getPart, updatePart } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { FlatPartSchema } from "@/lib/validations/parts";

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("parts:read");
  const part = await getPart(m.shopId, await uuidParam(ctx, "That part"));
  if (!part) throw new NotFound("That part");
  return Response.json({ part });
});

export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("parts:write");
  const id = await uuidParam(ctx, "That part");
  const v = FlatPartSchema.parse(await readJson(req));
  try {
    const part = await updatePart(m.shopId, id, v);
    if (!part) throw new NotFound("That part");
    return Response.json({ part });
  } catch (e) {
    if ((e as { code?: string }).code === "23505")
      throw new HttpError(409, "duplicate_sku", `SKU ${v.sku} is already in the catalog`);
    throw e;
  }
});

export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("parts:write");
  if (!(await deletePart(m.shopId, await uuidParam(ctx, "That part"))))
    throw new NotFound("That part");
  return new Response(null, { status: 204 });
});
