import { checkShareToken } from "@/db/queries/shares";
import { handle } from "@/lib/http/handler";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { renderSpecSheet } from "@/lib/pdf/spec-sheet";
import { pdfFileName, pdfResponse, specSheetData } from "@/lib/pdf/spec-sheet-data";

/** GET — the shared build's spec sheet, for anyone holding a valid link (no sign-in: the token is the key). */
export const GET = handle<{ params: Promise<{ token: string }> }>(async (_req, ctx) => {
  const check = await checkShareToken((await ctx.params).token);
  if (!check.ok)
    return Response.json(
      {
        error: {
          code: `link_${check.reason}`,
          message: "This link is not valid any more",
          issues: [],
        },
      },
      { status: 404 },
    );
  const data = await specSheetData(check.link.shopId, check.link.buildId, {});
  const pdf = await cachedPdf("spec-sheet", data, renderSpecSheet);
  return pdfResponse(pdf, pdfFileName(data.build.title, data.build.version), {
    "x-robots-tag": "noindex",
  });
});
