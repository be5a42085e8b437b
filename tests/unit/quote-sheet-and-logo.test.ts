import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema, sizeParsedFuelSystem } from "@/lib/calc";
import { checkLogo, imageInfo } from "@/lib/images/logo";
import { depositOf } from "@/lib/payments/deposit";
import { renderQuoteSheet, type QuoteSheetData } from "@/lib/pdf/quote-sheet";
import { renderSpecSheet } from "@/lib/pdf/spec-sheet";
import { presentQuote } from "@/lib/quotes/quote-presentation";

import { naFour } from "../calc/fixtures";
import { inspectPdf } from "../helpers/pdf";
import { solidPng } from "../helpers/png";

const quote = (extra: Partial<QuoteSheetData> = {}): QuoteSheetData => ({
  shop: { name: "Test Shop", address: "1 Test Road", phone: "555-0000" },
  quote: {
    label: "Q-0042",
    status: "Sent",
    createdAt: new Date("2026-11-30T10:00:00Z"),
    validUntil: "2026-12-30",
    notes: "Fitting on a weekday.",
    currency: "USD",
  },
  customer: { name: "Test Customer", email: "test@example.test" },
  buildTitle: "Sheet test build",
  // 6 × $100.00 less 10 % = $540.00; 4 × $120.00 = $480.00; subtotal (after discounts)
  // $1,020.00; tax 8.25 % = $84.15; total $1,104.15 (by hand).
  presented: presentQuote({ currency: "USD", taxRateBp: 825 }, [
    {
      kind: "part",
      sku: "TST-1",
      description: "Testbrand injector",
      quantityMilli: 6000,
      unitPriceMinor: 10000,
      discountBp: 1000,
    },
    {
      kind: "labour",
      sku: null,
      description: "Fitting labour",
      quantityMilli: 4000,
      unitPriceMinor: 12000,
      discountBp: 0,
    },
  ]),
  deposit: { rate: "30 %", amount: "$331.25", paid: null },
  paper: "a4",
  timeZone: "UTC",
  ...extra,
});

describe("quote PDF", () => {
  it("prints the lines, totals, deposit and caution on one page", async () => {
    const pdf = await renderQuoteSheet(quote());
    const { text, pages, title } = inspectPdf(pdf);
    expect(pages).toBe(1);
    expect(title).toBe("Quote Q-0042");
    const flat = text.replace(/\s+/g, " ");
    for (const s of [
      "Test Customer",
      "Testbrand injector",
      "TST-1",
      "Fitting labour",
      "10 % (-$60.00)",
      "$540.00",
      "Subtotal $1,020.00",
      "Includes discounts of $60.00",
      "$1,104.15",
      "Tax (8.25 %)",
      "30 % ($331.25)",
      "Fuel burns.",
      "local codes",
    ])
      expect(flat).toContain(s);
  });

  it("a paid deposit is shown as received", async () => {
    const { text } = inspectPdf(
      await renderQuoteSheet(
        quote({ deposit: { rate: "30 %", amount: "$331.25", paid: "2026-12-01" } }),
      ),
    );
    expect(text.replace(/\s+/g, " ")).toContain("Deposit of $331.25 received 2026-12-01");
  });

  it("the shop's logo is embedded in quotes and spec sheets", async () => {
    const logo = { data: solidPng(64, 32), format: "png" as const };
    expect(inspectPdf(await renderQuoteSheet(quote())).images).toBe(0);
    expect(
      inspectPdf(
        await renderQuoteSheet(
          quote({ shop: { name: "Test Shop", address: null, phone: null, logo } }),
        ),
      ).images,
    ).toBe(1);
    const input = FuelSystemInputSchema.parse(naFour);
    const sheet = await renderSpecSheet({
      shop: { name: "Test Shop", address: null, phone: null, logo },
      build: {
        title: "Logo build",
        vehicle: null,
        customerName: "C",
        version: 1,
        savedAt: new Date(),
        tunerName: null,
      },
      input,
      result: sizeParsedFuelSystem(input),
      parts: [],
      units: "metric",
      paper: "a4",
      timeZone: "UTC",
    });
    expect(inspectPdf(sheet).images).toBe(1);
  });
});

describe("logo checks", () => {
  it("knows PNG and JPEG by their bytes and reads their size", () => {
    expect(imageInfo(solidPng(120, 40))).toEqual({
      contentType: "image/png",
      width: 120,
      height: 40,
    });
    // A minimal JPEG header: SOI, APP0 (JFIF), SOF0 with height 48 and width 96 (ITU-T T.81, B.2.2).
    const jpeg = Buffer.from([
      0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00,
      0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xc0, 0x00, 0x11, 0x08, 0x00, 0x30, 0x00, 0x60, 0x03,
      0x01, 0x22, 0x00, 0x02, 0x11, 0x01, 0x03, 0x11, 0x01,
    ]);
    expect(imageInfo(jpeg)).toEqual({ contentType: "image/jpeg", width: 96, height: 48 });
    // A file cut short is refused: a JPEG without its EOI marker (ITU-T T.81, B.2.1), a PNG
    // without its final IEND chunk (PNG spec, ISO/IEC 15948, 11.2.5).
    expect(checkLogo(jpeg)).toMatchObject({
      ok: false,
      message: expect.stringMatching(/cut short/),
    });
    expect(checkLogo(Buffer.concat([jpeg, Buffer.from([0xff, 0xd9])]))).toMatchObject({ ok: true });
    const whole = solidPng(32, 32);
    expect(checkLogo(whole)).toMatchObject({ ok: true });
    expect(checkLogo(whole.subarray(0, whole.length - 6))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/cut short/),
    });
  });

  it("refuses what is not an image, too small, too large or too many pixels", () => {
    expect(checkLogo(Buffer.from("GIF89a not allowed"))).toMatchObject({
      ok: false,
      message: "The logo must be a PNG or JPEG image",
    });
    expect(checkLogo(Buffer.from("<svg xmlns='http://www.w3.org/2000/svg'/>"))).toMatchObject({
      ok: false,
    });
    expect(checkLogo(solidPng(8, 8))).toMatchObject({
      ok: false,
      message: expect.stringContaining("16 × 16"),
    });
    expect(checkLogo(solidPng(5000, 20))).toMatchObject({
      ok: false,
      message: expect.stringContaining("4000"),
    });
    expect(checkLogo(Buffer.alloc(1024 * 1024 + 1))).toMatchObject({
      ok: false,
      message: expect.stringContaining("1 MB"),
    });
    expect(checkLogo(solidPng(200, 80)).ok).toBe(true);
  });
});

describe("deposit", () => {
  it("is the shop's share of the total, rounded half up to the cent", () => {
    // By hand: 30 % of $1,104.15 = $331.245 → $331.25; of $0.05 = 1.5 c → 2 c; 0 % → 0.
    expect(depositOf(110415, 3000)).toBe(33125);
    expect(depositOf(5, 3000)).toBe(2);
    expect(depositOf(110415, 0)).toBe(0);
    expect(depositOf(110415, 10000)).toBe(110415);
  });
});
