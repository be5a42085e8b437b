import { getInvoice } from "@/db/queries/invoices";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { editInvoice } from "@/lib/invoices/invoice-commands";
import { invoiceData } from "@/lib/invoices/invoice-data";
import { InvoiceEditSchema } from "@/lib/validations/operations";

/** GET — the invoice with its lines, credit notes, payments and the ledger's balance. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("invoices:view");
  const inv = await getInvoice(
    m.shopId,
    await uuidParam(ctx, "That invoice"),
    ownRecordsOnly(m.role) ? m.user.id : undefined,
  );
  if (!inv) throw new NotFound("That invoice");
  return Response.json({ invoice: invoiceData(inv) });
});

/** PATCH { version, lines?, notes? } — a draft only; an issued invoice is 422 invoice_issued. */
export const PATCH = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That invoice");
  const body = await readJson(req);
  const input = InvoiceEditSchema.parse({ ...(body && typeof body === "object" ? body : {}), id });
  return Response.json({ invoice: invoiceData(await editInvoice(m, input)) });
});
