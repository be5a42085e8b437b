import type { PartCategory } from "@/lib/domain/parts";

/**
 * The demo shop's catalog: invented brands, part numbers and prices, with figures in realistic
 * ranges (injectors 440–2200 cc/min, pumps about 250–500 L/h at rail pressure). For demos only.
 */
export interface SeedPart {
  id: string;
  sku: string;
  category: PartCategory;
  brand: string;
  name: string;
  priceMinor: number;
  costMinor: number;
  stock: number;
  reorderLevel: number;
  /** Days from ordering to the shelf (the demo's invented supplier times); absent: not known. */
  leadTimeDays?: number;
  specs: Record<string, unknown>;
}

const id = (n: number) => `20000000-0000-4000-8000-${String(n).padStart(12, "0")}`;
let n = 0;
const part = (p: Omit<SeedPart, "id" | "costMinor"> & { costMinor?: number }): SeedPart => ({
  ...p,
  id: id(++n),
  costMinor: p.costMinor ?? Math.round(p.priceMinor * 0.62),
});

const injector = (flow: number, price: number, stock: number, minPw: number) =>
  part({
    sku: `HF-INJ-${flow}`,
    category: "injector",
    brand: "Halvorsen Flow",
    // A series number, as the pumps have, not a flow in one unit system: the name reaches
    // quotes and spec sheets as typed, the flow is a spec shown in the reader's units.
    name: `Series ${flow} high-impedance injector`,
    priceMinor: price,
    stock,
    reorderLevel: 8,
    leadTimeDays: 14,
    specs: {
      ratedFlowCcPerMin: flow,
      ratedPressureKpa: 300,
      minPulseWidthMs: minPw,
      impedance: "high",
      connector: "EV6",
      ethanolOk: true,
      deadTime: {
        voltages: [10, 12, 14],
        pressuresKpa: [300, 500],
        deadTimeMs: [
          [1.4, 1.6],
          [1.0, 1.15],
          [0.78, 0.9],
        ],
      },
    },
  });

const pump = (
  sku: string,
  name: string,
  flowAt300: number,
  price: number,
  stock: number,
  mounting: "in-tank" | "inline",
  ethanolOk = true,
) =>
  part({
    sku,
    category: "pump",
    brand: mounting === "in-tank" ? "Kettering Fuelworks" : "Orrin Motorsport",
    name,
    priceMinor: price,
    stock,
    reorderLevel: 2,
    leadTimeDays: mounting === "in-tank" ? 10 : 21,
    specs: {
      curves: [13.5, 12].map((v) => ({
        voltage: v,
        points: [300, 500, 700].map((p, i) => ({
          pressureKpa: p,
          flowLPerH: Math.round(flowAt300 * [1, 0.85, 0.68][i]! * (v === 12 ? 0.86 : 1)),
        })),
      })),
      currentA: Math.round(flowAt300 / 25),
      mounting,
      ethanolOk,
    },
  });

export const DEMO_PARTS: SeedPart[] = [
  injector(440, 6900, 24, 0.9),
  injector(550, 7400, 18, 0.9),
  injector(650, 7900, 16, 0.9),
  injector(750, 8900, 16, 1.0),
  injector(850, 9600, 12, 1.0),
  injector(1000, 10900, 24, 1.0),
  injector(1150, 11900, 8, 1.1),
  injector(1300, 12900, 12, 1.1),
  injector(1500, 14900, 16, 1.2),
  injector(1700, 16900, 8, 1.2),
  injector(1900, 18900, 4, 1.3),
  injector(2200, 21900, 8, 1.4),
  pump("KF-P255", "Cascade 255 in-tank pump", 255, 11900, 6, "in-tank", false),
  pump("KF-P300", "Cascade 300 in-tank pump", 300, 15900, 5, "in-tank"),
  pump("KF-P340", "Cascade 340 in-tank pump", 340, 18900, 7, "in-tank"),
  pump("KF-P400", "Cascade 400 in-tank pump", 400, 24900, 3, "in-tank"),
  pump("KF-P450", "Cascade 450 in-tank pump", 450, 29900, 2, "in-tank"),
  pump("OM-IL380", "Torrent 380 inline pump", 380, 27900, 2, "inline"),
  pump("OM-IL500", "Torrent 500 inline pump", 500, 38900, 1, "inline"),
  pump("OM-IL320", "Torrent 320 inline pump", 320, 21900, 0, "inline"),
  part({
    sku: "SW-REG-BR6",
    category: "regulator",
    brand: "Sablewood",
    name: "Boost-referenced regulator, −6 ports",
    priceMinor: 16900,
    stock: 6,
    reorderLevel: 2,
    specs: { type: "boost-referenced", minPressureKpa: 200, maxPressureKpa: 600, dash: 6 },
  }),
  part({
    sku: "SW-REG-BR8",
    category: "regulator",
    brand: "Sablewood",
    name: "Boost-referenced regulator, −8 ports",
    priceMinor: 21900,
    stock: 4,
    reorderLevel: 2,
    specs: { type: "boost-referenced", minPressureKpa: 250, maxPressureKpa: 700, dash: 8 },
  }),
  part({
    sku: "SW-REG-FX6",
    category: "regulator",
    brand: "Sablewood",
    name: "Fixed-rate regulator, −6 ports",
    priceMinor: 12900,
    stock: 3,
    reorderLevel: 1,
    specs: { type: "fixed", minPressureKpa: 250, maxPressureKpa: 500, dash: 6 },
  }),
  part({
    sku: "SW-REG-BR10",
    category: "regulator",
    brand: "Sablewood",
    name: "High-flow referenced regulator, −10 ports",
    priceMinor: 28900,
    stock: 1,
    reorderLevel: 1,
    specs: { type: "boost-referenced", minPressureKpa: 250, maxPressureKpa: 800, dash: 10 },
  }),
  part({
    sku: "TH-HOSE-6R",
    category: "line",
    brand: "Tamsin Hydraulics",
    name: "−6 rubber fuel hose (per m)",
    priceMinor: 1200,
    stock: 40,
    reorderLevel: 10,
    specs: { dash: 6, insideDiameterMm: 8.7, material: "nitrile rubber", ethanolOk: false },
  }),
  part({
    sku: "TH-HOSE-6P",
    category: "line",
    brand: "Tamsin Hydraulics",
    name: "−6 PTFE-lined braided hose (per m)",
    priceMinor: 2400,
    stock: 60,
    reorderLevel: 15,
    specs: { dash: 6, insideDiameterMm: 8.0, material: "PTFE, stainless braid", ethanolOk: true },
  }),
  part({
    sku: "TH-HOSE-8P",
    category: "line",
    brand: "Tamsin Hydraulics",
    name: "−8 PTFE-lined braided hose (per m)",
    priceMinor: 2900,
    stock: 45,
    reorderLevel: 15,
    specs: { dash: 8, insideDiameterMm: 10.3, material: "PTFE, stainless braid", ethanolOk: true },
  }),
  part({
    sku: "TH-HOSE-10P",
    category: "line",
    brand: "Tamsin Hydraulics",
    name: "−10 PTFE-lined braided hose (per m)",
    priceMinor: 3600,
    stock: 20,
    reorderLevel: 10,
    specs: { dash: 10, insideDiameterMm: 13.2, material: "PTFE, stainless braid", ethanolOk: true },
  }),
  part({
    sku: "TH-FIT-6S",
    category: "fitting",
    brand: "Tamsin Hydraulics",
    name: "−6 straight hose end",
    priceMinor: 1900,
    stock: 30,
    reorderLevel: 10,
    specs: { dash: 6 },
  }),
  part({
    sku: "TH-FIT-6E",
    category: "fitting",
    brand: "Tamsin Hydraulics",
    name: "−6 90° hose end",
    priceMinor: 2600,
    stock: 24,
    reorderLevel: 10,
    specs: { dash: 6 },
  }),
  part({
    sku: "TH-FIT-8S",
    category: "fitting",
    brand: "Tamsin Hydraulics",
    name: "−8 straight hose end",
    priceMinor: 2300,
    stock: 20,
    reorderLevel: 8,
    specs: { dash: 8 },
  }),
  part({
    sku: "TH-FIT-8E",
    category: "fitting",
    brand: "Tamsin Hydraulics",
    name: "−8 90° hose end",
    priceMinor: 3100,
    stock: 2,
    reorderLevel: 8,
    specs: { dash: 8 },
  }),
  part({
    sku: "OM-FLT-10-6",
    category: "filter",
    brand: "Orrin Motorsport",
    name: "10 µm post-pump filter, −6",
    priceMinor: 8900,
    stock: 8,
    reorderLevel: 3,
    specs: { micron: 10, dropKpa: 6, dash: 6, ethanolOk: true },
  }),
  part({
    sku: "OM-FLT-10-8",
    category: "filter",
    brand: "Orrin Motorsport",
    name: "10 µm post-pump filter, −8",
    priceMinor: 9900,
    stock: 6,
    reorderLevel: 3,
    specs: { micron: 10, dropKpa: 4, dash: 8, ethanolOk: true },
  }),
  part({
    sku: "OM-FLT-100-10",
    category: "filter",
    brand: "Orrin Motorsport",
    name: "100 µm pre-pump strainer, −10",
    priceMinor: 7900,
    stock: 5,
    reorderLevel: 2,
    specs: { micron: 100, dropKpa: 2, dash: 10, ethanolOk: true },
  }),
  part({
    sku: "KF-FLT-40-6",
    category: "filter",
    brand: "Kettering Fuelworks",
    name: "40 µm paper-element filter, −6",
    priceMinor: 3900,
    stock: 12,
    reorderLevel: 4,
    specs: { micron: 40, dropKpa: 9, dash: 6, ethanolOk: false },
  }),
  part({
    sku: "HF-ECS-1",
    category: "sensor",
    brand: "Halvorsen Flow",
    name: "Ethanol content sensor, −6 ports",
    priceMinor: 19900,
    stock: 5,
    reorderLevel: 2,
    specs: { kind: "ethanol" },
  }),
  part({
    sku: "HF-ECS-2",
    category: "sensor",
    brand: "Halvorsen Flow",
    name: "Ethanol content sensor with temperature, −8 ports",
    priceMinor: 24900,
    stock: 2,
    reorderLevel: 1,
    specs: { kind: "ethanol" },
  }),
  part({
    sku: "OM-RLY-30",
    category: "other",
    brand: "Orrin Motorsport",
    name: "Pump relay and 10 AWG harness",
    priceMinor: 6900,
    stock: 10,
    reorderLevel: 3,
    specs: {},
  }),
  part({
    sku: "KF-HAT-2",
    category: "other",
    brand: "Kettering Fuelworks",
    name: "Twin-pump hanger plate",
    priceMinor: 22900,
    stock: 2,
    reorderLevel: 1,
    specs: {},
  }),
];
