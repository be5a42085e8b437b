import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { createCreditNote } from "@/lib/invoices/invoice-commands";
import { invoiceData } from "@/lib/invoices/invoice-data";
import { CreditNoteCreateSchema } from "@/lib/validations/operations";

/** POST { reason, amountMinor } — a credit note correcting an issued invoice. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That invoice");
  const body = await readJson(req);
  const input = CreditNoteCreateSchema.parse({
    ...(body && typeof body === "object" ? body : {}),
    id,
  });
  return Response.json({ invoice: invoiceData(await createCreditNote(m, input)) }, { status: 201 });
});
