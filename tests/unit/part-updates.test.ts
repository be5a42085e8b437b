import { describe, expect, it } from "vitest";

import { parseCatalogCsv } from "@/lib/catalog/csv";
import {
  checkSpecs,
  CSV_COLUMNS,
  flatOf,
  FlatPartSchema,
  mergeSpecs,
  PartUpdateSchema,
  specKeysOfColumns,
} from "@/lib/validations/parts";

// Invented parts (inputs, not check values): an injector with a dead-time table, a pump with curves.
const deadTime = {
  voltages: [10, 12, 14],
  pressuresKpa: [300, 500],
  deadTimeMs: [
    [1.4, 1.6],
    [1.0, 1.15],
    [0.78, 0.9],
  ],
};
const injector = {
  sku: "T-INJ-1000",
  category: "injector" as const,
  brand: "Testbrand",
  name: "1000 cc/min injector",
  priceMinor: 10900,
  costMinor: 6758,
  stock: 24,
  reorderLevel: 8,
  leadTimeDays: 14 as number | null,
  restockOn: "2026-10-01" as string | null,
  specs: {
    ratedFlowCcPerMin: 1000,
    ratedPressureKpa: 300,
    minPulseWidthMs: 1.05,
    impedance: "high",
    connector: "EV6",
    ethanolOk: true,
    deadTime,
  },
};
const pump = {
  sku: "T-P340",
  category: "pump" as const,
  brand: "Testbrand",
  name: "340 in-tank pump",
  priceMinor: 18900,
  costMinor: 11718,
  stock: 7,
  reorderLevel: 2,
  leadTimeDays: null as number | null,
  restockOn: null as string | null,
  specs: {
    curves: [
      {
        voltage: 13.5,
        points: [
          { pressureKpa: 300, flowLPerH: 340 },
          { pressureKpa: 500, flowLPerH: 289 },
          { pressureKpa: 700, flowLPerH: 231 },
        ],
      },
      {
        voltage: 12,
        points: [
          { pressureKpa: 300, flowLPerH: 292 },
          { pressureKpa: 500, flowLPerH: 249 },
        ],
      },
    ],
    currentA: 14,
    mounting: "in-tank",
    ethanolOk: true,
  },
};
const ID = "00000000-0000-4000-8000-0000000000aa";

/** What the part form sends for a stored part nobody changed: every flat field it holds, and the id. */
const unchangedSave = (p: typeof injector | typeof pump) =>
  PartUpdateSchema.parse({ ...flatOf(p), category: p.category, id: ID });

describe("part updates are partial by construction", () => {
  it("an unchanged save of the part form gives back the stored specs exactly, dead-time table included", () => {
    for (const p of [injector, pump]) {
      const u = unchangedSave(p);
      expect(u.fields).toEqual({
        sku: p.sku,
        category: p.category,
        brand: p.brand,
        name: p.name,
        priceMinor: p.priceMinor,
        costMinor: p.costMinor,
        stock: p.stock,
        reorderLevel: p.reorderLevel,
        leadTimeDays: p.leadTimeDays,
        restockOn: p.restockOn,
      });
      const merged = mergeSpecs(p.category, p.specs, u.specs);
      expect(merged).toEqual(p.specs);
      expect(checkSpecs(p.category, merged)).toEqual({ ok: true, specs: p.specs });
    }
  });

  it("a spec key no sent column speaks for (the dead-time table) is kept; a blanked column clears its key", () => {
    const u = PartUpdateSchema.parse({ id: ID, connector: "", flow_cc_min: "1050" });
    expect(u.fields).toEqual({});
    expect(u.specs.covered.sort()).toEqual(["connector", "ratedFlowCcPerMin"]);
    const merged = mergeSpecs("injector", injector.specs, u.specs);
    expect(merged).toEqual({
      ...injector.specs,
      ratedFlowCcPerMin: 1050,
      connector: undefined,
    });
    expect("connector" in merged).toBe(false);
    expect(merged.deadTime).toEqual(deadTime);
  });

  it("sends nothing for fields not sent: no defaults creep in (rated pressure, ethanol, cost)", () => {
    const u = PartUpdateSchema.parse({ id: ID, name: "Renamed" });
    expect(u).toEqual({ id: ID, fields: { name: "Renamed" }, specs: { values: {}, covered: [] } });
  });

  it("a new part from the same flat row still gets the defaults of blank columns", () => {
    const v = FlatPartSchema.parse({
      sku: "N-1",
      category: "injector",
      brand: "B",
      name: "N",
      price: "10",
      stock: "1",
      flow_cc_min: "550",
    });
    expect(v.specs).toEqual({ ratedFlowCcPerMin: 550, ratedPressureKpa: 300, ethanolOk: false });
    expect(v.costMinor).toBe(0);
  });

  it("bad spec cells are field errors named by column, in a create and in a change", () => {
    const c = FlatPartSchema.safeParse({
      sku: "N-2",
      category: "injector",
      brand: "B",
      name: "N",
      price: "10",
      stock: "1",
      flow_cc_min: "lots",
    });
    expect(c.success).toBe(false);
    expect(c.error!.issues.map((i) => i.path.join("."))).toContain("flow_cc_min");
    const u = PartUpdateSchema.safeParse({ id: ID, ethanol_ok: "perhaps" });
    expect(u.error!.issues.map((i) => i.path.join("."))).toEqual(["ethanol_ok"]);
    const blankSku = PartUpdateSchema.safeParse({ id: ID, sku: " " });
    expect(blankSku.error!.issues.map((i) => i.path.join("."))).toEqual(["sku"]);
    const bad = checkSpecs("regulator", {
      type: "fixed",
      minPressureKpa: 400,
      maxPressureKpa: 300,
    });
    expect(bad).toMatchObject({ ok: false, issues: [{ path: "max_kpa" }] });
  });

  it("a CSV header speaks only for its own columns: a file without dead_time_ms keeps the table", () => {
    const all = specKeysOfColumns(CSV_COLUMNS);
    expect(all).toContain("deadTime");
    expect(all).toContain("curves");
    const parsed = parseCatalogCsv(
      "sku,category,brand,name,price,stock,flow_cc_min\nT-INJ-1000,injector,Testbrand,Renamed,109.00,24,1100\n",
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.columns).toEqual([
      "sku",
      "category",
      "brand",
      "name",
      "price",
      "stock",
      "flow_cc_min",
    ]);
    const covered = specKeysOfColumns(parsed.columns);
    expect(covered).toEqual(["ratedFlowCcPerMin"]);
    const merged = mergeSpecs("injector", injector.specs, {
      values: parsed.rows[0]!.specs,
      covered,
    });
    expect(merged).toEqual({ ...injector.specs, ratedFlowCcPerMin: 1100 });
  });
});
