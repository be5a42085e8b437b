import { z } from "zod";
import { getBuild, listRevisions } from "@/db/queries/builds";
import { NotFoundError } from "@/lib/auth/errors";
import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";

type Ctx = { params: Promise<{ id: string }> };

export const GET = handle<Ctx>(async (_req, ctx) => {
  const m = await requireMember("builds:read");
  const parsed = z.uuid().safeParse((await ctx.params).id);
  if (!parsed.success || !(await getBuild(m.shopId, parsed.data))) throw new NotFoundError("That build");
  return Response.json({ revisions: await listRevisions(m.shopId, parsed.data) });
});
