import { listParts } from "@/db/queries/parts";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createPart } from "@/lib/parts/part-commands";
import { FlatPartSchema, PartListQuery } from "@/lib/validations/parts";

/** GET /api/v1/parts?q=&category=&sort= — the shop's catalog. */
export const GET = handle(async (req) => {
  const m = await requireMember("parts:read");
  const q = PartListQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ parts: await listParts(m.shopId, q) });
});

/** POST /api/v1/parts — one part, as the flat fields of the catalog CSV (text). */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = FlatPartSchema.parse(await readJson(req));
  return Response.json({ part: await createPart(m, input) }, { status: 201 });
});
