import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { renderLedgerSheet } from "@/lib/pdf/ledger-sheet";
import { ledgerPdfName, purchaseOrderSheetData } from "@/lib/pdf/ledger-sheet-data";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { pdfResponse } from "@/lib/pdf/spec-sheet-data";

/** GET — the purchase order as PDF, on the shop's paper (staff only). */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("purchasing:read");
  const data = await purchaseOrderSheetData(m.shopId, await uuidParam(ctx, "That purchase order"));
  return pdfResponse(
    await cachedPdf("ledger-sheet", data, renderLedgerSheet),
    ledgerPdfName(data.title),
  );
});
