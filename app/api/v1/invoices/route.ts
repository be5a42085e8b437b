import { listInvoices } from "@/db/queries/invoices";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { createInvoice } from "@/lib/invoices/invoice-commands";
import { invoiceData } from "@/lib/invoices/invoice-data";
import { InvoiceCreateSchema } from "@/lib/validations/operations";

/** GET — the shop's invoices; a customer's own issued ones only. */
export const GET = handle(async () => {
  const m = await requireMember("invoices:view");
  const rows = await listInvoices(m.shopId, ownRecordsOnly(m.role) ? m.user.id : undefined);
  return Response.json({
    invoices: rows.map((r) => ({
      ...r.invoice,
      customerName: r.customerName,
      jobNumber: r.jobNumber,
    })),
  });
});

/** POST { jobId } — a draft invoice from a fitted job. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = InvoiceCreateSchema.parse(await readJson(req));
  return Response.json({ invoice: invoiceData(await createInvoice(m, input)) }, { status: 201 });
});
