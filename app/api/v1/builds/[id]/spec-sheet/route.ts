import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { renderSpecSheet } from "@/lib/pdf/spec-sheet";
import { pdfFileName, pdfResponse, specSheetData } from "@/lib/pdf/spec-sheet-data";
import { SpecSheetQuery } from "@/lib/validations/builds";

/** GET ?version=N — the build's spec sheet as PDF, from its latest (or the named) saved revision. */
export const GET = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember("builds:view");
  const id = await uuidParam(ctx, "That build");
  const { version } = SpecSheetQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
  const data = await specSheetData(m.shopId, id, {
    version,
    portalUserId: ownRecordsOnly(m.role) ? m.user.id : undefined,
    viewerId: m.user.id,
  });
  const pdf = await cachedPdf("spec-sheet", data, renderSpecSheet);
  return pdfResponse(pdf, pdfFileName(data.build.title, data.build.version));
});
