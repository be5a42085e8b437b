import { getQuote, updateQuote } from "@/db/queries/quotes";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { QuoteUpdateSchema } from "@/lib/validations/quotes";

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:view");
  const q = await getQuote(
    m.shopId,
    await uuidParam(ctx, "That quote"),
    ownRecordsOnly(m.role) ? m.user.id : undefined,
  );
  if (!q) throw new NotFound("That quote");
  return Response.json(q);
});

/** PATCH with the `version` the edit started from: lines, validity, notes (draft or sent only). */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("quotes:write");
  const id = await uuidParam(ctx, "That quote");
  const body = QuoteUpdateSchema.parse(await readJson(req));
  return Response.json({ quote: await updateQuote(m.shopId, id, body.version, body) });
});
