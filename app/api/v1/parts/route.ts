import { createPart, listParts } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";
import { FlatPartSchema, PartListQuery } from "@/lib/validations/parts";

/** GET /api/v1/parts?q=&category=&sort= — the shop's catalog. */
export const GET = handle(async (req) => {
  const m = await requireMember("parts:read");
  const q = PartListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ parts: await listParts(m.shopId, q) });
});

/** POST /api/v1/parts — one part, as the flat fields of the catalog CSV (all strings). */
export const POST = handle(async (req) => {
  const m = await requireMember("parts:write");
  const v = FlatPartSchema.parse(await readJson(req));
  const part = await createPart(m.shopId, v);
  if (!part) throw new HttpError(409, "duplicate_sku", `SKU ${v.sku} is already in the catalog`);
  return Response.json({ part }, { status: 201 });
});
