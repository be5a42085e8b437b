import { z } from "zod";

import { getQuote, setQuoteStatus } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";
import { uuidParam, type IdCtx } from "@/lib/http/params";

const Body = z.object({
  decision: z.enum(["accept", "decline"], { error: "Say accept or decline" }),
});

/** POST { decision } — the customer accepts or declines their own sent quote (time and who are recorded). */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("quotes:respond");
  const id = await uuidParam(ctx, "That quote");
  const { decision } = Body.parse(await readJson(req));
  const q = await getQuote(m.shopId, id, m.user.id);
  if (!q) throw new NotFound("That quote");
  if (q.quote.status !== "sent")
    throw new HttpError(409, "not_open", "This quote is no longer open for a decision");
  const quote = await setQuoteStatus(
    m.shopId,
    id,
    m.user.id,
    decision === "accept" ? "accepted" : "declined",
    { portalUserId: m.user.id },
  );
  return Response.json({ quote });
});
