import { describe, expect, it } from "vitest";

import {
  billedMilli,
  fitPlan,
  fitShortages,
  fittedSummary,
  invoiceBalance,
  invoiceLinesFromJob,
  invoiceTotals,
  jobStatusFor,
  taxInside,
  type JobLineState,
} from "@/lib/domain/jobs";
import { creditNoteLabel, invoiceLabel, jobLabel, poLabel } from "@/lib/domain/operations";
import {
  cancelRefusal,
  poStatusAfterReceipt,
  receiptIssues,
  releaseBackOrders,
  reorderList,
  type BackOrder,
} from "@/lib/domain/purchasing";

// Parts, quotes and prices here are invented inputs; the arithmetic is checked by hand
// (common practice, no source).

describe("reorder list", () => {
  it("orders back-orders plus the minimum, less what is free or already on order", () => {
    const rows = reorderList(
      [
        { id: "pump", stock: 1, reserved: 1, reorderLevel: 2 },
        { id: "hose", stock: 10, reserved: 0, reorderLevel: 2 },
        { id: "rail", stock: 0, reserved: 0, reorderLevel: 0 },
      ],
      new Map([
        ["pump", 3],
        ["rail", 2],
      ]),
      new Map([["rail", 1]]),
    );
    expect(rows).toEqual([
      { partId: "pump", free: 0, backOrdered: 3, belowMinimum: 2, onOrder: 0, suggested: 5 },
      { partId: "rail", free: 0, backOrdered: 2, belowMinimum: 0, onOrder: 1, suggested: 1 },
    ]);
  });

  it("lists a part under its minimum even when enough is on order, suggesting nothing more", () => {
    const [row] = reorderList(
      [{ id: "p", stock: 1, reserved: 0, reorderLevel: 4 }],
      new Map(),
      new Map([["p", 5]]),
    );
    expect(row).toMatchObject({ belowMinimum: 3, suggested: 0 });
  });

  it("does not mutate its inputs", () => {
    const back = new Map([["p", 1]]);
    reorderList([{ id: "p", stock: 0, reserved: 0, reorderLevel: 0 }], back, new Map());
    expect([...back]).toEqual([["p", 1]]);
  });
});

describe("receiving against a purchase order", () => {
  const lines = [
    { id: "a", quantity: 4, receivedQty: 1 },
    { id: "b", quantity: 2, receivedQty: 0 },
  ];
  it("takes up to what is outstanding per line", () => {
    expect(receiptIssues(lines, [{ lineId: "a", quantity: 3 }])).toEqual([]);
  });
  it("refuses more than is outstanding, a line of another order, a line twice and nothing at all", () => {
    expect(receiptIssues(lines, [{ lineId: "a", quantity: 4 }])).toEqual([
      { path: "lines.0.quantity", message: "Only 3 still outstanding on this line" },
    ]);
    expect(receiptIssues(lines, [{ lineId: "z", quantity: 1 }])[0]!.path).toBe("lines.0.lineId");
    expect(
      receiptIssues(lines, [
        { lineId: "b", quantity: 1 },
        { lineId: "b", quantity: 1 },
      ])[0]!.path,
    ).toBe("lines.1.lineId");
    expect(receiptIssues(lines, [{ lineId: "b", quantity: 0 }])[0]!.path).toBe("lines");
  });
  it("is partly received until every line has all it ordered", () => {
    expect(poStatusAfterReceipt(lines)).toBe("partly_received");
    expect(
      poStatusAfterReceipt([
        { id: "a", quantity: 4, receivedQty: 4 },
        { id: "b", quantity: 2, receivedQty: 2 },
      ]),
    ).toBe("received");
  });
});

describe("cancelling a purchase order", () => {
  const none = [{ id: "l1", quantity: 3, receivedQty: 0 }];
  it("is allowed for a draft or sent order that received nothing", () => {
    expect(cancelRefusal("draft", none)).toBeNull();
    expect(cancelRefusal("sent", none)).toBeNull();
  });
  it("is refused once anything arrived, and for an order already cancelled", () => {
    expect(cancelRefusal("sent", [{ id: "l1", quantity: 3, receivedQty: 1 }])).toMatch(/received/);
    expect(cancelRefusal("partly_received", none)).toMatch(/received/);
    expect(cancelRefusal("received", none)).toMatch(/received/);
    expect(cancelRefusal("cancelled", none)).toMatch(/cancelled already/);
  });
});

describe("back-orders released in the order the quotes were accepted", () => {
  const bo = (lineId: string, acceptedAt: string, wanted: number, held = 0): BackOrder => ({
    lineId,
    quoteId: `q-${lineId}`,
    partId: "pump",
    position: 1,
    wanted,
    held,
    acceptedAt,
  });
  it("gives the first accepted all it lacks before the next gets any", () => {
    const out = releaseBackOrders(
      [bo("late", "2026-03-02T09:00:00Z", 2), bo("early", "2026-03-01T09:00:00Z", 2, 1)],
      new Map([["pump", 2]]),
    );
    expect([...out]).toEqual([
      ["early", 1],
      ["late", 1],
    ]);
  });
  it("gives nothing when nothing is free, and never more than a line lacks", () => {
    expect(releaseBackOrders([bo("a", "2026-03-01", 1)], new Map()).size).toBe(0);
    expect([...releaseBackOrders([bo("a", "2026-03-01", 1)], new Map([["pump", 9]]))]).toEqual([
      ["a", 1],
    ]);
  });
});

const line = (id: string, partId: string | null, quantity: number, allocated = quantity) =>
  ({
    id,
    quoteLineId: `ql-${id}`,
    partId,
    sku: partId,
    description: `Part ${id}`,
    quantity,
    allocatedQty: allocated,
    unitPriceMinor: 10000,
    discountBp: 0,
  }) satisfies JobLineState;

describe("jobs", () => {
  it("is ready to fit only when every line has all its units", () => {
    expect(jobStatusFor([line("a", "p", 2), line("b", "q", 1, 0)])).toBe("waiting_parts");
    expect(jobStatusFor([line("a", "p", 2), line("b", "q", 1)])).toBe("ready");
    expect(jobStatusFor([])).toBe("ready");
  });

  it("fitting issues what was fitted and releases what the job held, a substitute as an extra line", () => {
    const plan = fitPlan(
      [line("a", "pump", 2), line("b", "hose", 1)],
      [
        { partId: "pump", quantity: 1 },
        { partId: "rail", quantity: 1 },
      ],
    );
    expect([...plan.fitted]).toEqual([
      ["a", 1],
      ["b", 0],
    ]);
    expect(plan.extra).toEqual([{ partId: "rail", quantity: 1 }]);
    expect([...plan.issue]).toEqual([
      ["pump", 1],
      ["rail", 1],
    ]);
    expect([...plan.release]).toEqual([
      ["pump", 2],
      ["hose", 1],
    ]);
  });

  it("refuses to fit more than the shelf has for this job", () => {
    const plan = fitPlan([line("a", "pump", 1)], [{ partId: "pump", quantity: 3 }]);
    const issues = fitShortages(
      plan,
      new Map([["pump", { stock: 3, reserved: 2, sku: "PMP-1" }]]),
      new Map([["pump", 0]]),
    );
    // Usable: 3 on the shelf − 2 reserved + 1 this job holds = 2.
    expect(issues).toEqual([
      { path: "parts.0.quantity", message: "Only 2 of PMP-1 on the shelf for this job" },
    ]);
  });
});

describe("invoices", () => {
  const labour = {
    kind: "labour" as const,
    partId: null,
    sku: null,
    description: "Fitting",
    quantityMilli: 4000,
    unitPriceMinor: 12000,
    discountBp: 0,
  };
  it("charges what was fitted and the labour used; the deposit comes off the total", () => {
    const lines = invoiceLinesFromJob(
      { labourMilli: 2500 },
      [
        { ...line("a", "pump", 2), fittedQty: 1 },
        { ...line("b", "hose", 1), fittedQty: 0 },
      ],
      [labour],
    );
    expect(lines.map((l) => [l.kind, l.quantityMilli, l.unitPriceMinor])).toEqual([
      ["part", 1000, 10000],
      ["labour", 2500, 12000],
    ]);
    // 100.00 + 2.5 h × 120.00 = 400.00; tax 8.25 % = 33.00; total 433.00; less 120.00 deposit.
    expect(invoiceTotals(lines, 825, 12000)).toEqual({
      subtotalMinor: 40000,
      discountMinor: 0,
      taxMinor: 3300,
      totalMinor: 43300,
      depositMinor: 12000,
      dueMinor: 31300,
    });
  });

  it("bills fractional hours and a fractional quoted quantity exactly, never rounded to whole units", () => {
    // Quoted: 1.5 m of hose (stock moves in whole metres: 2 are held and issued) and 1.5 h.
    const quoted = new Map([["ql-h", 1500]]);
    const hose = { ...line("h", "hose", 2), fittedQty: 2 };
    const [part, work] = invoiceLinesFromJob({ labourMilli: 1500 }, [hose], [labour], quoted);
    expect(part!.quantityMilli).toBe(1500);
    expect(work!.quantityMilli).toBe(1500);
    // 1.5 × 100.00 + 1.5 h × 120.00 = 330.00 (not 2 × 100.00 + 2 h × 120.00 = 440.00).
    expect(invoiceTotals([part!, work!], 0, 0).totalMinor).toBe(33000);
    // One whole metre fitted bills one; one more than quoted bills the quoted 1.5 and one whole.
    expect(billedMilli(1, 2, 1500)).toBe(1000);
    expect(billedMilli(3, 2, 1500)).toBe(2500);
    // A part not from the quote (an extra) bills its whole units.
    expect(billedMilli(2, 2, null)).toBe(2000);
  });

  it("keeps the quoted hours when none are given", () => {
    const [l] = invoiceLinesFromJob({ labourMilli: null }, [], [labour]);
    expect(l!.quantityMilli).toBe(4000);
  });

  it("adds up the balance from the ledger", () => {
    expect(
      invoiceBalance({
        totalMinor: 43300,
        depositMinor: 12000,
        credits: [1000],
        payments: [30300],
      }),
    ).toEqual({ creditedMinor: 1000, paidMinor: 30300, balanceMinor: 0 });
  });

  it("finds the tax inside a credited amount", () => {
    // 108.25 including 8.25 % tax: 100.00 net, 8.25 tax.
    expect(taxInside(10825, 825)).toBe(825);
    expect(taxInside(1000, 0)).toBe(0);
  });

  it("labels documents with their numbers", () => {
    expect([
      poLabel(3),
      jobLabel(12),
      invoiceLabel(7),
      invoiceLabel(null),
      creditNoteLabel(1),
    ]).toEqual(["PO-0003", "J-0012", "INV-0007", "Draft invoice", "CN-0001"]);
  });
});

describe("fittedSummary: what a fitted job's quote says instead of a stock promise", () => {
  // Invented lines; the sentences are the product's own wording (common practice, no source).
  it("names the units fitted, and a quoted part not fitted", () => {
    expect(
      fittedSummary([
        { description: "Pump A", quantity: 1, fittedQty: 1 },
        { description: "Filter B", quantity: 2, fittedQty: 0 },
        { description: "Pump C", quantity: 0, fittedQty: 1 },
      ]),
    ).toBe("Fitted: 1 × Pump A, 1 × Pump C. Quoted, not fitted: Filter B.");
    expect(fittedSummary([{ description: "Hose", quantity: 3, fittedQty: 0 }])).toBe(
      "No parts were fitted. Quoted, not fitted: Hose.",
    );
  });
});
