import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { issueInvoice } from "@/lib/invoices/invoice-commands";
import { invoiceData } from "@/lib/invoices/invoice-data";
import { InvoiceIssueSchema } from "@/lib/validations/operations";

/** POST { version } — issues a draft: numbered, frozen, e-mailed to the customer. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That invoice");
  const body = await readJson(req);
  const input = InvoiceIssueSchema.parse({
    version: (body as { version?: unknown } | null)?.version,
    id,
  });
  return Response.json({ invoice: invoiceData(await issueInvoice(m, input)) });
});
