import { and, asc, desc, eq } from "drizzle-orm";

import { db } from "@/db";
import {
  creditNotes,
  customers,
  invoiceLines,
  invoices,
  jobs,
  payments,
  quoteLines,
  quotes,
  type Invoice,
} from "@/db/schema";
import { formatMoney } from "@/lib/catalog/money";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { invoiceBalance, invoiceTotals, taxInside, type ChargeLine } from "@/lib/domain/jobs";

import { nextShopNumber, type Tx } from "./counters";
import { sameLines, totalColumns } from "./document-lines";

const invoiceSelect = {
  invoice: invoices,
  customerName: customers.name,
  customerEmail: customers.email,
  customerUserId: customers.userId,
  jobNumber: jobs.number,
  quoteNumber: quotes.number,
  quoteRevision: quotes.revision,
};

const base = () =>
  db
    .select(invoiceSelect)
    .from(invoices)
    .innerJoin(customers, eq(customers.id, invoices.customerId))
    .innerJoin(jobs, eq(jobs.id, invoices.jobId))
    .innerJoin(quotes, eq(quotes.id, invoices.quoteId));

/** A customer sees an invoice once it is issued, never a draft. */
const portalScope = (portalUserId?: string) =>
  portalUserId ? and(eq(customers.userId, portalUserId)) : undefined;

export async function listInvoices(shopId: string, portalUserId?: string) {
  const rows = await base()
    .where(and(eq(invoices.shopId, shopId), portalScope(portalUserId)))
    .orderBy(desc(invoices.createdAt));
  return portalUserId ? rows.filter((r) => r.invoice.status !== "draft") : rows;
}

/** The invoice with its lines, credit notes, balance payments and the ledger's balance. */
export async function getInvoice(shopId: string, id: string, portalUserId?: string) {
  const [row] = await base()
    .where(and(eq(invoices.shopId, shopId), eq(invoices.id, id), portalScope(portalUserId)))
    .limit(1);
  if (!row || (portalUserId && row.invoice.status === "draft")) return null;
  const [lines, credits, paid] = await Promise.all([
    db
      .select()
      .from(invoiceLines)
      .where(and(eq(invoiceLines.shopId, shopId), eq(invoiceLines.invoiceId, id)))
      .orderBy(asc(invoiceLines.position)),
    db
      .select()
      .from(creditNotes)
      .where(and(eq(creditNotes.shopId, shopId), eq(creditNotes.invoiceId, id)))
      .orderBy(asc(creditNotes.number)),
    db
      .select()
      .from(payments)
      .where(and(eq(payments.shopId, shopId), eq(payments.invoiceId, id)))
      .orderBy(asc(payments.createdAt)),
  ]);
  const ledger = invoiceBalance({
    totalMinor: row.invoice.totalMinor,
    depositMinor: row.invoice.depositMinor,
    credits: credits.map((c) => c.amountMinor),
    payments: paid.filter((p) => p.status === "paid").map((p) => p.amountMinor),
  });
  return { ...row, lines, creditNotes: credits, payments: paid, ledger };
}
export type InvoiceRow = NonNullable<Awaited<ReturnType<typeof getInvoice>>>;

/** Deposits paid on a quote (the payments ledger), in minor units. */
async function depositPaid(tx: Tx, shopId: string, quoteId: string) {
  const rows = await tx
    .select({ amount: payments.amountMinor, status: payments.status, kind: payments.kind })
    .from(payments)
    .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId)));
  return rows
    .filter((r) => r.kind === "deposit" && r.status === "paid")
    .reduce((s, r) => s + r.amount, 0);
}

/**
 * A draft invoice for a fitted job (one per job), with the lines the command worked out from
 * the job and the deposit paid on its quote taken off. Conflict if the job is not fitted or has
 * an invoice.
 */
export async function insertInvoice(
  shopId: string,
  userId: string,
  jobId: string,
  lines: (
    job: typeof jobs.$inferSelect,
    quoteOther: ChargeLine[],
    quotedMilli: ReadonlyMap<string, number>,
  ) => ChargeLine[],
): Promise<Invoice> {
  return db.transaction(async (tx) => {
    const [job] = await tx
      .select()
      .from(jobs)
      .where(and(eq(jobs.shopId, shopId), eq(jobs.id, jobId)))
      .for("update")
      .limit(1);
    if (!job) throw new NotFound("That job");
    if (job.status !== "fitted")
      throw new Conflict("An invoice is raised once the job is fitted", "not_fitted", job);
    const [had] = await tx.select().from(invoices).where(eq(invoices.jobId, jobId)).limit(1);
    if (had) throw new Conflict("This job already has an invoice", "invoice_exists", had);
    const [q] = await tx.select().from(quotes).where(eq(quotes.id, job.quoteId)).limit(1);
    const other = await tx
      .select()
      .from(quoteLines)
      .where(eq(quoteLines.quoteId, job.quoteId))
      .orderBy(asc(quoteLines.position));
    const charged = lines(
      job,
      other
        .filter((l) => l.kind !== "part")
        .map((l) => ({
          kind: l.kind,
          partId: l.partId,
          sku: l.sku,
          description: l.description,
          quantityMilli: l.quantityMilli,
          unitPriceMinor: l.unitPriceMinor,
          discountBp: l.discountBp,
        })),
      new Map(other.filter((l) => l.kind === "part").map((l) => [l.id, l.quantityMilli])),
    );
    const deposit = await depositPaid(tx, shopId, job.quoteId);
    const t = invoiceTotals(charged, q!.taxRateBp, deposit);
    const [inv] = await tx
      .insert(invoices)
      .values({
        shopId,
        jobId,
        quoteId: job.quoteId,
        customerId: job.customerId,
        currency: q!.currency,
        taxRateBp: q!.taxRateBp,
        ...totalColumns(t),
        depositMinor: t.depositMinor,
        createdBy: userId,
      })
      .returning();
    await writeLines(tx, shopId, inv!.id, charged);
    return inv!;
  });
}

async function writeLines(tx: Tx, shopId: string, invoiceId: string, lines: ChargeLine[]) {
  await tx.delete(invoiceLines).where(eq(invoiceLines.invoiceId, invoiceId));
  if (lines.length)
    await tx
      .insert(invoiceLines)
      .values(lines.map((l, i) => ({ ...l, shopId, invoiceId, position: i + 1 })));
}

async function lockInvoice(tx: Tx, shopId: string, id: string) {
  const [inv] = await tx
    .select()
    .from(invoices)
    .where(and(eq(invoices.shopId, shopId), eq(invoices.id, id)))
    .for("update")
    .limit(1);
  if (!inv) throw new NotFound("That invoice");
  return inv;
}

const frozen = (inv: Invoice) =>
  new Conflict(
    "An issued invoice is never edited; raise a credit note to correct it",
    "invoice_issued",
    inv,
  );

/** Edits a draft's notes and lines (totals worked out again); an issued invoice is a Conflict. */
export async function updateInvoiceDraft(
  shopId: string,
  id: string,
  version: number,
  v: { notes?: string; lines?: ChargeLine[] },
): Promise<Invoice> {
  return db.transaction(async (tx) => {
    const inv = await lockInvoice(tx, shopId, id);
    if (inv.status !== "draft") throw frozen(inv);
    if (inv.version !== version)
      throw new Conflict(
        `Someone changed this invoice meanwhile (now version ${inv.version}); nothing was overwritten`,
        "conflict",
        inv,
      );
    const notes = v.notes === undefined ? inv.notes : v.notes || null;
    let lines = v.lines;
    if (lines) {
      // Lines equal to the stored ones (in order) are not written again.
      const stored = await tx
        .select()
        .from(invoiceLines)
        .where(eq(invoiceLines.invoiceId, id))
        .orderBy(asc(invoiceLines.position));
      if (sameLines(stored, lines)) lines = undefined;
    }
    let totals = {};
    if (lines) {
      await writeLines(tx, shopId, id, lines);
      totals = totalColumns(invoiceTotals(lines, inv.taxRateBp, inv.depositMinor));
    } else if (notes === inv.notes) return inv;
    const [done] = await tx
      .update(invoices)
      .set({ ...totals, notes, version: inv.version + 1, updatedAt: new Date() })
      .where(eq(invoices.id, id))
      .returning();
    return done!;
  });
}

/** Issues a draft: it takes the shop's next invoice number and is frozen from now on. */
export async function issueInvoiceRow(
  shopId: string,
  id: string,
  userId: string,
  version: number,
): Promise<Invoice> {
  return db.transaction(async (tx) => {
    const inv = await lockInvoice(tx, shopId, id);
    if (inv.status !== "draft") throw frozen(inv);
    if (inv.version !== version)
      throw new Conflict(
        `Someone changed this invoice meanwhile (now version ${inv.version}); it was not issued`,
        "conflict",
        inv,
      );
    const number = await nextShopNumber(tx, shopId, "invoice");
    const settled = inv.totalMinor - inv.depositMinor <= 0;
    const [done] = await tx
      .update(invoices)
      .set({
        number,
        status: settled ? "paid" : "issued",
        issuedAt: new Date(),
        issuedBy: userId,
        ...(settled ? { paidAt: new Date() } : {}),
        version: inv.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(invoices.id, id))
      .returning();
    return done!;
  });
}

/**
 * A credit note on an issued invoice: at most what is left to credit (the total less the deposit
 * and earlier credit notes — money paid by card is refunded outside), with the tax inside it at
 * the invoice's rate; numbered per shop. An invoice whose balance it clears is paid.
 */
export async function insertCreditNote(
  shopId: string,
  invoiceId: string,
  userId: string,
  v: { reason: string; amountMinor: number },
) {
  return db.transaction(async (tx) => {
    const inv = await lockInvoice(tx, shopId, invoiceId);
    if (inv.status === "draft")
      throw new Conflict("A draft invoice is edited, not credited", "invoice_draft", inv);
    const [credits, paid] = await Promise.all([
      tx.select().from(creditNotes).where(eq(creditNotes.invoiceId, invoiceId)),
      tx.select().from(payments).where(eq(payments.invoiceId, invoiceId)),
    ]);
    const ledger = invoiceBalance({
      totalMinor: inv.totalMinor,
      depositMinor: inv.depositMinor,
      credits: credits.map((c) => c.amountMinor),
      payments: paid.filter((p) => p.status === "paid").map((p) => p.amountMinor),
    });
    const creditable = inv.totalMinor - ledger.creditedMinor;
    if (v.amountMinor > creditable)
      throw Conflict.field(
        "amountMinor",
        `At most ${formatMoney(creditable, inv.currency)} is left to credit on this invoice`,
        "credit_too_large",
      );
    const number = await nextShopNumber(tx, shopId, "credit_note");
    const [note] = await tx
      .insert(creditNotes)
      .values({
        shopId,
        number,
        invoiceId,
        reason: v.reason,
        amountMinor: v.amountMinor,
        taxMinor: taxInside(v.amountMinor, inv.taxRateBp),
        createdBy: userId,
      })
      .returning();
    if (inv.status === "issued" && ledger.balanceMinor - v.amountMinor <= 0)
      await tx
        .update(invoices)
        .set({
          status: "paid",
          paidAt: new Date(),
          version: inv.version + 1,
          updatedAt: new Date(),
        })
        .where(eq(invoices.id, invoiceId));
    return note!;
  });
}
