import { describe, expect, it } from "vitest";

import {
  FuelSystemInputSchema,
  issueMessage,
  numberFromField,
  parseNumberText,
  type IssueLike,
} from "@/lib/calc";
import { BuildGoalSchema } from "@/lib/validations/builds";

import { boostedSix } from "../calc/fixtures";

// How people write numbers (common practice, no source): a decimal point or comma, thousands
// grouped by commas, spaces or points.
describe("number fields read what people type", () => {
  it.each([
    ["7000", 7000],
    ["7,000", 7000],
    ["7 000", 7000],
    ["1,234.5", 1234.5],
    ["1.234,5", 1234.5],
    ["12,000,000", 12_000_000],
    ["7.5", 7.5],
    ["7,5", 7.5],
    ["0,850", 0.85],
    [" 42 ", 42],
    ["-3", -3],
    ["1e5", 100000],
    [".5", 0.5],
  ])("%j → %d", (text, value) => expect(parseNumberText(text)).toBe(value));

  it.each(["seven", "7,00,0", "1,2,3", "0x10", "7k", "Infinity", "7..0", ""])(
    "%j is no number",
    (text) => expect(parseNumberText(text)).toBeNaN(),
  );

  it("a blank field is no value; a number from a JSON body passes as it is", () => {
    expect(numberFromField("  ")).toBeUndefined();
    expect(numberFromField(7000)).toBe(7000);
    expect(numberFromField("7,000")).toBe(7000);
  });

  it("the goal form takes 7,000 as seven thousand", () => {
    const goal = BuildGoalSchema.safeParse({
      displacementL: "2,0",
      cylinders: "4",
      aspiration: "turbo",
      powerKw: "1,000",
      measuredAt: "crank",
      fuel: "e85",
    });
    expect(goal.error?.issues ?? []).toEqual([]);
    expect(goal.data).toMatchObject({ displacementL: 2, powerKw: 1000 });
  });
});

describe("a number too large to hold is out of range, with the limits", () => {
  const withBoost = (maxBoostKpa: number) =>
    FuelSystemInputSchema.safeParse({
      ...boostedSix,
      engine: { ...boostedSix.engine, maxBoostKpa },
    });

  it("Infinity (1e308 psi once in kPa) is refused on boost with its limits, not as 'not a number'", () => {
    const r = withBoost(1e308 * 6.894757);
    const issue = r.error!.issues.find((i) => i.path.join(".") === "engine.maxBoostKpa")!;
    expect(issue.message).toBe("Boost must be between 0 and 500 kPa");
    // The editor's message, in the reader's units: 500 kPa = 72.5 psi (NIST SP 811 B.8).
    expect(issueMessage(issue as IssueLike, "imperial")).toBe(
      "Boost must be between 0 and 72.5 psi",
    );
    expect(issueMessage(issue as IssueLike, "metric")).toBe("Boost must be between 0 and 500 kPa");
    // Text that is no number still says so.
    const nan = withBoost(NaN).error!.issues.find(
      (i) => i.path.join(".") === "engine.maxBoostKpa",
    )!;
    expect(nan.message).toBe("Boost must be a number");
  });
});
