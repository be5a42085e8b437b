import "server-only";

import type { NoticeKind } from "@/lib/domain/operations";
import { renderLedgerSheet } from "@/lib/pdf/ledger-sheet";
import {
  invoiceSheetData,
  ledgerPdfName,
  purchaseOrderSheetData,
} from "@/lib/pdf/ledger-sheet-data";
import { cachedPdf } from "@/lib/pdf/render-cache";

type Attachment = { filename: string; content: Buffer; contentType: string };
/** Files a notice carries, made when it is sent (and made again on a retry). */
export type AttachmentMaker = () => Promise<Attachment[]>;

/** The files of a notice: the invoice's PDF, a purchase order's; none for the others. */
export function noticeFiles(
  kind: NoticeKind,
  shopId: string,
  recordId: string,
): AttachmentMaker | undefined {
  const data =
    kind === "invoice"
      ? () => invoiceSheetData(shopId, recordId)
      : kind === "po_to_supplier"
        ? () => purchaseOrderSheetData(shopId, recordId)
        : null;
  if (!data) return undefined;
  return async () => {
    const sheet = await data();
    return [
      {
        filename: ledgerPdfName(sheet.title),
        content: await cachedPdf("ledger-sheet", sheet, renderLedgerSheet),
        contentType: "application/pdf",
      },
    ];
  };
}
