import fc from "fast-check";
import { describe, expect, it } from "vitest";

import { catalogCsv, parseCatalogCsv } from "@/lib/catalog/csv";
import { neutraliseCell, neutraliseCsvText, undoNeutralisedCell } from "@/lib/format/csv";
import { editVersion } from "@/lib/validations/column-bounds";
import {
  flatOf,
  formatDeadTime,
  parseDeadTime,
  PartUpdateSchema,
  specKeysOfColumns,
} from "@/lib/validations/parts";

// Invented parts (inputs, not check values): a dead-time table, pump curves, hostile names.
const deadTime = {
  voltages: [10, 12, 13.5, 14],
  pressuresKpa: [300, 437.5, 500],
  deadTimeMs: [
    [1.4, 1.52, 1.6],
    [1.0, 1.075, 1.15],
    [0.85, 0.9, 0.95],
    [0.78, 0.85, 0.9],
  ],
};
const base = {
  priceMinor: 10950,
  costMinor: 6790,
  stock: 12,
  reorderLevel: 3,
  leadTimeDays: null as number | null,
  restockOn: null as string | null,
};
const PARTS = [
  {
    ...base,
    sku: "RT-INJ",
    category: "injector" as const,
    brand: "Testbrand",
    name: '=HYPERLINK("http://evil.example","click")',
    specs: {
      ratedFlowCcPerMin: 1000,
      ratedPressureKpa: 300,
      minPulseWidthMs: 1.05,
      impedance: "high",
      connector: "-EV6",
      ethanolOk: true,
      deadTime,
    },
  },
  {
    ...base,
    leadTimeDays: 21,
    restockOn: "2026-09-15",
    sku: "RT-PMP",
    category: "pump" as const,
    brand: "@Testbrand",
    name: "'=already quoted",
    specs: {
      curves: [
        {
          voltage: 13.5,
          points: [
            { pressureKpa: 300, flowLPerH: 340 },
            { pressureKpa: 500, flowLPerH: 289 },
            { pressureKpa: 700, flowLPerH: 231.5 },
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
      ethanolOk: false,
    },
  },
  {
    ...base,
    leadTimeDays: 0,
    sku: "RT-LINE",
    category: "line" as const,
    brand: "+Plus",
    name: "-6 AN hose",
    specs: { dash: 8, insideDiameterMm: 11.1, material: "PTFE", ethanolOk: true },
  },
];

/** What the import makes of a file, as the stored parts it would write. */
const importedParts = (csv: string) => {
  const parsed = parseCatalogCsv(csv);
  expect(parsed.errors).toEqual([]);
  return parsed.rows.map(({ line: _line, ...p }) => p);
};

describe("spreadsheet formulas in exports (OWASP CSV injection)", () => {
  it("prefixes text cells that start with = + - @, a tab or a carriage return", () => {
    expect(neutraliseCell("=1+1")).toBe("'=1+1");
    expect(neutraliseCell("+SUM(A1)")).toBe("'+SUM(A1)");
    expect(neutraliseCell("-2+3")).toBe("'-2+3");
    expect(neutraliseCell("@cmd")).toBe("'@cmd");
    expect(neutraliseCell("\tx")).toBe("'\tx");
    expect(neutraliseCell("\rx")).toBe("'\rx");
    expect(neutraliseCell("Plain")).toBe("Plain");
    expect(neutraliseCell("")).toBe("");
  });

  it("leaves numbers as numbers, negative ones included", () => {
    for (const n of ["-12.5", "+3", "-0", "-1,5", "-.5", "-1e-7", "349.00"])
      expect(neutraliseCell(n)).toBe(n);
  });

  it("a cell already starting with apostrophes before a formula gets one more, so the import gives it back", () => {
    expect(neutraliseCell("'=1")).toBe("''=1");
    expect(undoNeutralisedCell("''=1")).toBe("'=1");
    expect(undoNeutralisedCell("'plain")).toBe("'plain");
    expect(undoNeutralisedCell("'-5")).toBe("-5");
  });

  it("export then import gives back every cell exactly (generated text)", () => {
    const piece = fc.constantFrom(
      "=",
      "+",
      "-",
      "@",
      "\t",
      "\r",
      "'",
      "1",
      ".",
      ",",
      "a",
      " ",
      "e",
    );
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 8 }), (chars) => {
        const cell = chars.join("");
        const out = neutraliseCell(cell);
        expect(undoNeutralisedCell(out)).toBe(cell);
        // What a spreadsheet sees starts a formula only when it is a plain number.
        const formulaStart = out.length > 0 && "=+-@\t\r".includes(out[0]!);
        if (formulaStart) expect(out).toMatch(/^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/);
      }),
      { numRuns: 2000, seed: 16 },
    );
  });

  it("neutralises a delimited text in place: quoting, line ends and other bytes kept", () => {
    const plain = "RPM;Duty;Lambda\r\nrpm;%;λ\r\n3000;-41,5;0,79\r\n";
    expect(neutraliseCsvText(plain, ";")).toBe(plain);
    expect(neutraliseCsvText('a,b\n1,"=1+1"\n=cmd,"x ""q"""\n', ",")).toBe(
      'a,b\n1,"\'=1+1"\n\'=cmd,"x ""q"""\n',
    );
    expect(neutraliseCsvText("a\t@b\n", "\t")).toBe("a\t'@b\n");
    expect(neutraliseCsvText("", ",")).toBe("");
  });
});

describe("catalog CSV carries every field of a part", () => {
  it("has a column for every spec key of every category (sensor's fixed kind aside)", () => {
    const covered = new Set(specKeysOfColumns(Object.keys(flatOf({ ...PARTS[0]! }))));
    for (const key of [
      "ratedFlowCcPerMin",
      "ratedPressureKpa",
      "minPulseWidthMs",
      "impedance",
      "connector",
      "ethanolOk",
      "deadTime",
      "curves",
      "currentA",
      "mounting",
      "type",
      "minPressureKpa",
      "maxPressureKpa",
      "dash",
      "insideDiameterMm",
      "material",
      "micron",
      "dropKpa",
    ])
      expect(covered, key).toContain(key);
  });

  it("export → import → export is identical, dead-time tables, pump curves and formula-like text included", () => {
    const first = catalogCsv(PARTS);
    expect(first).toContain("'=HYPERLINK");
    expect(first).toContain("'@Testbrand");
    expect(first).toContain("''=already quoted");
    expect(first).toContain("'-6 AN hose");
    expect(first).toContain(",'-EV6,");
    expect(first).toContain("10V 300:1.4 437.5:1.52 500:1.6 | 12V 300:1 437.5:1.075 500:1.15");
    const back = importedParts(first);
    expect(back.map((p) => p.specs)).toEqual(PARTS.map((p) => p.specs));
    expect(back.map((p) => p.name)).toEqual(PARTS.map((p) => p.name));
    // Lead time and expected restock: a number, 0 and "not known" (blank) all come back as they were.
    expect(back.map((p) => [p.leadTimeDays, p.restockOn])).toEqual(
      PARTS.map((p) => [p.leadTimeDays, p.restockOn]),
    );
    expect(first.split("\r\n")[0]).toMatch(/,reorder_level,lead_time_days,restock_on,/);
    expect(catalogCsv(back)).toBe(first);
  });

  it("the dead-time cell reads back the table it was written from", () => {
    expect(parseDeadTime(formatDeadTime(deadTime))).toEqual(deadTime);
    expect(parseDeadTime("12 V 300:0.9 500:1 | 14v 300:0.7 500:0.8")).toEqual({
      voltages: [12, 14],
      pressuresKpa: [300, 500],
      deadTimeMs: [
        [0.9, 1],
        [0.7, 0.8],
      ],
    });
  });

  it("bad dead-time and curve cells are errors with their line and column; nothing else is read", () => {
    const head =
      "sku,category,brand,name,price,stock,flow_cc_min,dead_time_ms,pump_curve,mounting\n";
    const bad = [
      "A,injector,B,N,1,1,550,12V 300:0.9 500:1 | 14V 300:0.7,,", // pressures differ per voltage
      "B,injector,B,N,1,1,550,14V 300:0.9 | 12V 300:0.7,,", // voltages fall
      "C,injector,B,N,1,1,550,12V 300:,,", // a missing dead time
      "D,injector,B,N,1,1,550,twelve volts,,",
      "E,injector,B,N,1,1,550,12V 300:11,,", // above 10 ms
      "F,pump,B,N,1,1,,,13.5V 300: 500:290,in-tank", // a missing flow
    ];
    const parsed = parseCatalogCsv(head + bad.join("\n") + "\n");
    expect(parsed.rows).toEqual([]);
    expect(parsed.errors.map((e) => [e.line, e.field])).toEqual([
      [2, "dead_time_ms"],
      [3, "dead_time_ms"],
      [4, "dead_time_ms"],
      [5, "dead_time_ms"],
      [6, "dead_time_ms"],
      [7, "pump_curve"],
    ]);
    for (const e of parsed.errors.slice(0, 5)) expect(e.message).toMatch(/12V 300:0\.85/);
  });

  it("a form or file with dead_time_ms speaks for the table; a blank cell clears it", () => {
    const set = PartUpdateSchema.parse({
      id: "00000000-0000-4000-8000-0000000000aa",
      dead_time_ms: "12V 300:0.9",
      version: "4",
    });
    expect(set.version).toBe(4);
    expect(set.specs).toEqual({
      covered: ["deadTime"],
      values: { deadTime: { voltages: [12], pressuresKpa: [300], deadTimeMs: [[0.9]] } },
    });
    const cleared = PartUpdateSchema.parse({
      id: "00000000-0000-4000-8000-0000000000aa",
      dead_time_ms: " ",
    });
    expect(cleared.specs).toEqual({ covered: ["deadTime"], values: {} });
    expect(cleared.version).toBeUndefined();
  });
});

describe("the version an edit form started from", () => {
  it("is read from a form's text and from JSON; blank or absent is none; bad ones are field errors", () => {
    const v = editVersion();
    expect(v.parse("3")).toBe(3);
    expect(v.parse(3)).toBe(3);
    expect(v.parse("")).toBeUndefined();
    expect(v.parse(undefined)).toBeUndefined();
    for (const bad of ["abc", "0", "1.5", String(2 ** 31), -1, true])
      expect(v.safeParse(bad).success, String(bad)).toBe(false);
    expect(v.safeParse("abc").error?.issues[0]?.message).toBe("version must be a whole number");
  });
});
