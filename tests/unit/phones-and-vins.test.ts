import { describe, expect, it } from "vitest";

import { draftInputs } from "@/lib/builds/defaults";
import { FuelSystemInputSchema } from "@/lib/calc";
import { refusedMove, statusMoves, vehicleText } from "@/lib/domain/builds";
import { taxIdLabel } from "@/lib/domain/countries";
import { normaliseVin, vinCheckDigit, vinProblem } from "@/lib/domain/vin";
import { formatPhone, phoneSearchDigits, readPhone } from "@/lib/format/phone";
import { BuildDraftFormSchema, BuildDraftSchema } from "@/lib/validations/builds";
import { CustomerSchema } from "@/lib/validations/customers";
import { VehicleSchema } from "@/lib/validations/vehicles";

describe("phone numbers (libphonenumber-js)", () => {
  it("reads a local spelling with the shop's country and stores E.164", () => {
    // 201 is a New Jersey area code and 555-01XX the range set aside for fiction
    // (North American Numbering Plan Administrator, "555 NXX" assignments; from memory).
    for (const typed of ["(201) 555-0188", "201-555-0188", "2015550188", "+1 201 555 0188"])
      expect(readPhone(typed, "US")).toEqual({ ok: true, e164: "+12015550188" });
    // A UK number in the national format, read in a British shop (Ofcom's drama range 020 7946 0xxx; from memory).
    expect(readPhone("020 7946 0018", "GB")).toEqual({ ok: true, e164: "+442079460018" });
  });

  it("refuses a number without its area code, and text that is no number", () => {
    expect(readPhone("555-0188", "US").ok).toBe(false);
    expect(readPhone("call me", "US").ok).toBe(false);
  });

  it("shows a number nationally at home and internationally from elsewhere", () => {
    expect(formatPhone("+12015550188", "US")).toBe("(201) 555-0188");
    expect(formatPhone("+442079460018", "US")).toBe("+44 20 7946 0018");
    expect(formatPhone("555-0142", "US")).toBe("555-0142"); // kept as typed before numbers were read
    expect(formatPhone(null, "US")).toBe("");
  });

  it("turns a search that looks like a phone number into the digits to look for", () => {
    expect(phoneSearchDigits("5550188", "US")).toContain("5550188");
    expect(phoneSearchDigits("555-0188", "US")).toContain("5550188");
    expect(phoneSearchDigits("(555) 0188", "US")).toContain("5550188");
    expect(phoneSearchDigits("+1 555 0188", "US")).toContain("5550188");
    expect(phoneSearchDigits("1 (201) 555-0188", "US")).toContain("2015550188");
    expect(phoneSearchDigits("Subaru", "US")).toEqual([]);
    expect(phoneSearchDigits("555", "US")).toEqual([]);
  });
});

describe("VINs", () => {
  it("computes the check digit of the usual worked example", () => {
    // 49 CFR 565.15's weights; the example VIN 1M8GDM9AXKP042788 with check digit X is
    // Wikipedia's "Vehicle identification number", check-digit calculation (from memory).
    expect(vinCheckDigit("1M8GDM9AXKP042788")).toBe("X");
    expect(vinProblem("1M8GDM9AXKP042788", 1989)).toBeNull();
  });

  it("says what is wrong with a bad one", () => {
    expect(vinProblem("1M8GDM9A1KP042788", 1989)).toMatch(/check digit/);
    expect(vinProblem("1M8GDM9AXKP04278", 1989)).toMatch(/17 characters/);
    expect(vinProblem("1M8GDM9AXKP0427O8", 1989)).toMatch(/I, O or Q/);
    // Before 1981 a maker's own shorter number is taken.
    expect(vinProblem("JH4123", 1972)).toBeNull();
  });

  it("normalises spaces, dashes and case; the schema checks it", () => {
    expect(normaliseVin(" 1m8-gdm9ax kp042788")).toBe("1M8GDM9AXKP042788");
    const ok = VehicleSchema.safeParse({
      year: "1989",
      make: "Harlan",
      model: "Vesta",
      vin: "1m8gdm9axkp042788",
    });
    expect(ok.success && ok.data.vin).toBe("1M8GDM9AXKP042788");
    const bad = VehicleSchema.safeParse({
      year: 2015,
      make: "Harlan",
      model: "Vesta",
      vin: "1M8GDM9A1KP042788",
    });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]?.path).toEqual(["vin"]);
    expect(
      VehicleSchema.safeParse({ year: "", make: "Harlan", model: "Vesta" }).error?.issues[0]
        ?.message,
    ).toBe("Enter the model year");
  });
});

describe("customers' details", () => {
  it("asks for a tax number only where the shop's country uses one", () => {
    expect(taxIdLabel("US")).toBeNull();
    expect(taxIdLabel("GB")).toBe("VAT number");
    expect(taxIdLabel("AU")).toBe("ABN");
  });

  it("takes a known country code, upper-cased, and refuses an unknown one", () => {
    expect(CustomerSchema.parse({ name: "A", country: "gb" }).country).toBe("GB");
    expect(CustomerSchema.parse({ name: "A", country: "" }).country).toBeNull();
    expect(CustomerSchema.safeParse({ name: "A", country: "QQ" }).success).toBe(false);
  });
});

describe("the counter's draft build", () => {
  const goal = {
    displacementL: 2.2,
    cylinders: 4,
    aspiration: "na",
    powerKw: 150,
    measuredAt: "wheel",
    fuel: "e85",
  } as const;

  it("starts from the goal: engine, power, fuel range, one injector per cylinder, no boost when NA", () => {
    const inputs = draftInputs(
      BuildDraftSchema.parse({ customerId: crypto.randomUUID(), goal }).goal,
    );
    expect(inputs.engine).toMatchObject({
      cylinders: 4,
      displacementL: 2.2,
      aspiration: "na",
      maxBoostKpa: 0,
    });
    expect(inputs.target).toMatchObject({ powerKw: 150, measuredAt: "wheel" });
    // ASTM D5798's E85 range, 51–83 vol % (lib/calc/fuel.ts E85_STANDARD_RANGES).
    expect(inputs.fuel).toEqual({ ethanolMinVolPct: 51, ethanolMaxVolPct: 83 });
    expect(inputs.injectors.count).toBe(4);
    expect(FuelSystemInputSchema.safeParse(inputs).success).toBe(true);
  });

  it("the form's power is in the person's units: 500 hp is 372.85 kW", () => {
    // 1 hp = 745.699872 W (NIST SP 811, appendix B.8).
    const d = BuildDraftFormSchema.parse({
      customerId: crypto.randomUUID(),
      vehicleId: "new",
      "vehicle.year": "2004",
      "vehicle.make": "Tamsin",
      "vehicle.model": "Coupe",
      units: "imperial",
      displacement: "122",
      cylinders: "4",
      aspiration: "turbo",
      power: "500",
      measuredAt: "crank",
      fuel: "gasoline",
    });
    expect(d.goal.powerKw).toBeCloseTo(372.85, 2);
    // 122 cu in = 1.999 L (1 in³ = 16.387064 cm³ exactly, NIST SP 811 B.8).
    expect(d.goal.displacementL).toBeCloseTo(1.9992, 4);
    expect(d.newVehicle).toMatchObject({ year: 2004, make: "Tamsin", model: "Coupe" });
    expect(d.vehicleId).toBeUndefined();
  });

  it("the form's displacement and power out of bounds are said in the person's units", () => {
    const form = (units: string, displacement: string, power: string) =>
      BuildDraftFormSchema.safeParse({
        customerId: crypto.randomUUID(),
        vehicleId: "new",
        "vehicle.year": "2004",
        "vehicle.make": "Tamsin",
        "vehicle.model": "Coupe",
        units,
        displacement,
        cylinders: "4",
        aspiration: "turbo",
        power,
        measuredAt: "crank",
        fuel: "gasoline",
      });
    const messages = (r: ReturnType<typeof form>) =>
      Object.fromEntries(r.error!.issues.map((i) => [i.path.join("."), i.message]));
    // 2.2 typed as cu in is 0.036 L, below the schema's 0.1 L: an imperial reader typing litres.
    // 0.1–20 L = 6.1–1220.5 cu in, 1–5000 kW = 1.34–6705.1 hp (NIST SP 811 B.8), rounded inwards.
    expect(messages(form("imperial", "2.2", "9000"))).toEqual({
      displacement: "Displacement must be between 7 and 1220 cu in",
      power: "Power goal must be between 2 and 6705 hp",
    });
    expect(messages(form("metric", "25", "6000"))).toEqual({
      displacement: "Displacement must be between 0.1 and 20 L",
      power: "Power goal must be between 1 and 5000 kW",
    });
    expect(form("imperial", "350", "450").success).toBe(true);
    // Said beside the other fields' errors, not only once they are right.
    const partial = BuildDraftFormSchema.safeParse({
      customerId: crypto.randomUUID(),
      units: "imperial",
      displacement: "2.2",
    });
    expect(messages(partial as ReturnType<typeof form>)).toMatchObject({
      displacement: "Displacement must be between 7 and 1220 cu in",
      power: "Enter the power goal",
    });
  });

  it("names the missing goal fields by their paths", () => {
    const r = BuildDraftFormSchema.safeParse({ customerId: crypto.randomUUID(), units: "metric" });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["displacement", "cylinders", "power", "fuel"]));
  });

  it("needs sizing moves on to sized (or draft), never further", () => {
    const facts = { quotes: [], verifiedLog: false, today: "2026-01-01" };
    expect(statusMoves("needs_sizing", facts).map((m) => [m.to, m.allowed])).toEqual([
      ["sized", true],
      ["draft", true],
    ]);
    expect(refusedMove("needs_sizing", "quoted", facts)).toMatch(/cannot go/);
    expect(refusedMove("draft", "needs_sizing", facts)).toMatch(/cannot go/);
  });

  it("keeps the vehicle as words for the builds search", () => {
    expect(vehicleText({ year: 2004, make: "Tamsin", model: "Coupe", engine: "2.0 turbo" })).toBe(
      "2004 Tamsin Coupe (2.0 turbo)",
    );
  });
});
