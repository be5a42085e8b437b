import { z } from "zod";

import { getBuild } from "@/db/queries/builds";
import { createShareLink, listShareLinks } from "@/db/queries/shares";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

const Body = z.object({
  days: z
    .number({ error: "days must be a number" })
    .int("days must be a whole number")
    .min(1, "A link lasts at least 1 day")
    .max(90, "A link lasts at most 90 days")
    .default(14),
});

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("shares:manage");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id))) throw new NotFound("That build");
  return Response.json({ links: await listShareLinks(m.shopId, id) });
});

/** POST { days } — a new expiring link to the build's spec sheet; the URL is shown once. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("shares:manage");
  const id = await uuidParam(ctx, "That build");
  const { days } = Body.parse(await readJson(req));
  if (!(await getBuild(m.shopId, id))) throw new NotFound("That build");
  const { link, token } = await createShareLink(m.shopId, id, m.user.id, days);
  return Response.json(
    {
      link: { id: link.id, expiresAt: link.expiresAt },
      url: `${serverEnv().APP_URL}/share/${token}`,
    },
    { status: 201 },
  );
});
