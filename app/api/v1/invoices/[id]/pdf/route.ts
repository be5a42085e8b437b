import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { renderLedgerSheet } from "@/lib/pdf/ledger-sheet";
import { invoiceSheetData, ledgerPdfName } from "@/lib/pdf/ledger-sheet-data";
import { cachedPdf } from "@/lib/pdf/render-cache";
import { pdfResponse } from "@/lib/pdf/spec-sheet-data";

/** GET — the invoice as PDF, on the shop's paper. Staff any of the shop's; a customer their own issued one. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("invoices:view");
  const id = await uuidParam(ctx, "That invoice");
  const data = await invoiceSheetData(m.shopId, id, ownRecordsOnly(m.role) ? m.user.id : undefined);
  return pdfResponse(
    await cachedPdf("ledger-sheet", data, renderLedgerSheet),
    ledgerPdfName(data.title),
  );
});
