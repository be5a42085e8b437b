import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { retryNotice } from "@/lib/notices/notice-commands";

/** POST — sends a failed notice again (staff). */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(await retryNotice(m, { id: await uuidParam(ctx, "That e-mail") }));
});
