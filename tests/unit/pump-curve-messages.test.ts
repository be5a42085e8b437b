import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema, issueMessages } from "@/lib/calc";
import { checkSpecs } from "@/lib/validations/parts";

import { boostedSix } from "../calc/fixtures";

/** A pump curve's mistakes name the curve (its voltage) and the point, at that point's field. */
const withCurve = (points: { pressureKpa: number; flowLPerH: number }[]) => ({
  ...boostedSix,
  pumps: [
    {
      quantity: 1,
      curves: [boostedSix.pumps[0]!.curves[0]!, { voltage: 13.5, points }],
    },
  ],
});

describe("pump curve messages (build editor and part editor)", () => {
  it("a repeated pressure marks the second point's pressure and names the curve and the first point", () => {
    const r = FuelSystemInputSchema.safeParse(
      withCurve([
        { pressureKpa: 300, flowLPerH: 340 },
        { pressureKpa: 500, flowLPerH: 290 },
        { pressureKpa: 300, flowLPerH: 330 },
      ]),
    );
    expect(r.success).toBe(false);
    const metric = issueMessages(r.error!.issues, "metric");
    expect(metric["pumps.0.curves.1.points.2.pressureKpa"]).toBe(
      "On the 13.5 V curve, point 3 has the pressure of point 1: each pressure may appear once on a curve, at least 1.0 kPa from the next",
    );
    expect(Object.keys(metric)).not.toContain("pumps.0.curves.1.points");
    // In imperial the gap is said in psi (1 kPa = 0.145 psi; NIST SP 811 B.8).
    expect(
      issueMessages(r.error!.issues, "imperial")["pumps.0.curves.1.points.2.pressureKpa"],
    ).toMatch(/at least 0\.1\d? psi/);
  });

  it("a flow rising with pressure marks that point's flow and names the curve", () => {
    const r = FuelSystemInputSchema.safeParse(
      withCurve([
        { pressureKpa: 300, flowLPerH: 340 },
        { pressureKpa: 500, flowLPerH: 360 },
      ]),
    );
    expect(r.success).toBe(false);
    expect(issueMessages(r.error!.issues, "metric")["pumps.0.curves.1.points.1.flowLPerH"]).toBe(
      "On the 13.5 V curve, point 2 flows more than point 1 at a lower pressure: a pump's flow falls as pressure rises",
    );
  });

  it("two curves at one voltage are refused at the second curve's voltage, never thrown later", () => {
    const first = boostedSix.pumps[0]!.curves[0]!;
    const r = FuelSystemInputSchema.safeParse({
      ...boostedSix,
      pumps: [{ quantity: 1, curves: [first, { ...first }] }],
    });
    expect(r.success).toBe(false);
    const messages = issueMessages(r.error!.issues, "metric");
    expect(messages["pumps.0.curves.1.voltage"]).toMatch(
      /^Curve 2 is at the voltage of curve 1 \(\d+(\.\d+)? V\): give each curve its own voltage$/,
    );
  });

  it("the part editor's flow curve field says the same, not the cell's internal name", () => {
    const curve = (points: { pressureKpa: number; flowLPerH: number }[]) =>
      checkSpecs("pump", {
        mounting: "in-tank",
        ethanolOk: true,
        curves: [{ voltage: 12, points }],
      });
    const dup = curve([
      { pressureKpa: 300, flowLPerH: 300 },
      { pressureKpa: 300, flowLPerH: 280 },
    ]);
    expect(dup.ok).toBe(false);
    const msg = !dup.ok ? dup.issues.map((i) => `${i.path}: ${i.message}`).join("\n") : "";
    expect(msg).toContain(
      "pump_curve: Flow curve: On the 12 V curve, point 2 has the pressure of point 1",
    );
    expect(msg).not.toMatch(/pump_curve needs/);
    const rising = curve([
      { pressureKpa: 300, flowLPerH: 300 },
      { pressureKpa: 500, flowLPerH: 320 },
    ]);
    expect(!rising.ok && rising.issues[0]!.message).toContain(
      "On the 12 V curve, point 2 flows more than point 1",
    );
  });
});
