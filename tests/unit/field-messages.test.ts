import { describe, expect, it } from "vitest";

import { newBuildInputs } from "@/lib/builds/defaults";
import { FuelSystemInputSchema } from "@/lib/calc";
import { issueMessages } from "@/lib/calc/issue-messages";
import { partFieldMessage, partHints } from "@/lib/parts/part-units";
import { BuildGoalSchema } from "@/lib/validations/builds";
import { checkSpecs } from "@/lib/validations/parts";
import { ShopSettingsPatchSchema } from "@/lib/validations/settings";

/**
 * What a person reads when a field is refused: its label and the rule, never an internal name
 * or the validation library's own wording. Bounds are the schemas' (common practice, no source).
 */
describe("field messages say the field and the rule", () => {
  it("a whole-number field given a fraction says it must be a whole number, not its bounds", () => {
    const inputs = newBuildInputs() as unknown as { injectors: { count: number } };
    inputs.injectors.count = 0.5;
    const r = FuelSystemInputSchema.safeParse(inputs);
    expect(r.success).toBe(false);
    expect(issueMessages(r.error!.issues, "imperial")["injectors.count"]).toBe(
      "Injector count must be a whole number",
    );
    const cyl = newBuildInputs() as unknown as { engine: { cylinders: number } };
    cyl.engine.cylinders = 4.5;
    const c = FuelSystemInputSchema.safeParse(cyl);
    expect(issueMessages(c.error!.issues, "metric")["engine.cylinders"]).toBe(
      "Cylinders must be a whole number",
    );
    const goal = BuildGoalSchema.safeParse({
      displacementL: "2",
      cylinders: "0.5",
      aspiration: "turbo",
      powerKw: "300",
      fuel: "gasoline",
    });
    expect(goal.error?.issues.find((i) => i.path[0] === "cylinders")?.message).toBe(
      "Cylinders must be a whole number",
    );
    // Named as the settings form labels it ("Quotes valid for … days"); JSON numbers in the API.
    const days = ShopSettingsPatchSchema.safeParse({ quoteValidDays: 0.5 });
    expect(days.error?.issues[0]?.message).toBe("Quotes valid for is a whole number of days");
  });

  it("every spec field of every part category is named by its label", () => {
    const cases: [string, Record<string, unknown>, string, string][] = [
      [
        "injector",
        { ratedFlowCcPerMin: 1000, ratedPressureKpa: 300, minPulseWidthMs: -1, ethanolOk: true },
        "min_pulse_ms",
        "Minimum pulse width must be between 0.1 and 10 ms",
      ],
      [
        "injector",
        {
          ratedFlowCcPerMin: 1000,
          ratedPressureKpa: 300,
          connector: "x".repeat(41),
          ethanolOk: true,
        },
        "connector",
        "Connector must be at most 40 characters",
      ],
      [
        "pump",
        {
          curves: [
            {
              voltage: 13.5,
              points: [
                { pressureKpa: 300, flowLPerH: 300 },
                { pressureKpa: 500, flowLPerH: 250 },
              ],
            },
          ],
          currentA: 99,
          mounting: "in-tank",
          ethanolOk: true,
        },
        "current_a",
        "Current draw must be between 0 and 80 A",
      ],
      [
        "regulator",
        { type: "fixed", minPressureKpa: 200, maxPressureKpa: 600, dash: 2 },
        "an_dash",
        "Port size must be a whole AN dash size from 4 to 16",
      ],
      [
        "line",
        { dash: 6.5, insideDiameterMm: 8, ethanolOk: true },
        "an_dash",
        "AN dash size must be a whole number from 3 to 20",
      ],
      [
        "filter",
        { micron: 0, dropKpa: 5, ethanolOk: true },
        "micron",
        "Rating must be between 1 and 500 µm",
      ],
    ];
    for (const [category, specs, column, expected] of cases) {
      const r = checkSpecs(category as never, specs);
      expect(r.ok, `${category} ${column}`).toBe(false);
      const issue = !r.ok ? r.issues.find((i) => i.path === column) : undefined;
      expect(issue, `${category} ${column}`).toBeDefined();
      const said = partFieldMessage(column, issue!.message, "imperial", category);
      expect(said).toBe(expected);
      // No column name, no library wording.
      expect(said).not.toMatch(/_|Too small|Too big|expected/);
    }
  });

  it("the part form's hints speak only the reader's units", () => {
    expect(partHints("imperial").rated_kpa).toBe("43.5 psi is the usual rating pressure"); // 300 kPa = 43.5 psi, NIST SP 811 B.8
    expect(partHints("imperial").rated_kpa).not.toMatch(/bar|kPa/);
    expect(partHints("metric").rated_kpa).toBe("300 kPa is the usual rating pressure");
  });
});
