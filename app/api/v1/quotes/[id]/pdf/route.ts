import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { renderQuoteSheet } from "@/lib/pdf/quote-sheet";
import { quotePdfName, quoteSheetData } from "@/lib/pdf/quote-sheet-data";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { pdfResponse } from "@/lib/pdf/spec-sheet-data";

/** GET — the quote as PDF. Staff read any of the shop's; a customer only their own (else 404). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("quotes:view");
  const id = await uuidParam(ctx, "That quote");
  const data = await quoteSheetData(m.shopId, id, ownRecordsOnly(m.role) ? m.user.id : undefined);
  return pdfResponse(
    await cachedPdf("quote-sheet", data, renderQuoteSheet),
    quotePdfName(data.quote.label),
  );
});
