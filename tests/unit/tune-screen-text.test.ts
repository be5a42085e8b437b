import { describe, expect, it } from "vitest";

import { pullBadge } from "@/components/dyno/limit-badge";
import { basisText } from "@/components/dyno/step-basis";
import { stepTarget } from "@/lib/tune/step-target";

describe("the pull card's badge", () => {
  it("names every limit a pull is over, not only the first", () => {
    const checks = [
      { key: "lambda", status: "within" },
      { key: "duty", status: "over" },
      { key: "egt", status: "over" },
      { key: "egtSpread", status: "over" },
      { key: "backPressure", status: "near" },
      { key: "turboSpeed", status: "not-set" },
    ] as const;
    expect(pullBadge([...checks])!.text).toBe(
      "Over 3 limits: injector duty, exhaust gas temperature and EGT spread between cylinders",
    );
    expect(pullBadge([{ key: "duty", status: "over" }])!.text).toBe("Over: injector duty");
    expect(
      pullBadge([
        { key: "duty", status: "near" },
        { key: "backPressure", status: "near" },
      ])!.text,
    ).toBe("Near 2 limits: injector duty and exhaust-to-boost pressure ratio");
    expect(pullBadge([{ key: "duty", status: "within" }])!.text).toBe("Within every limit logged");
    expect(pullBadge([{ key: "egt", status: "no-data" }])).toBeNull();
  });
});

describe("the next step's target", () => {
  const turbo = { aspiration: "turbo", maxBoostKpa: 150, wantedKw: 600 };
  const last = { crankKw: 450, boostKpa: 60 };
  it("a blank boost is exactly the build's boost target, not the boost its power target needs", () => {
    // The tester's case: the build's target is 150 kPa; blank must predict at 150, not 153.
    expect(stepTarget(turbo, last, { by: "boost" })).toEqual({
      target: { boostKpa: 150 },
      basis: "build-boost",
    });
    expect(stepTarget(turbo, last, { by: "power" })).toEqual({
      target: { crankKw: 600 },
      basis: "build-power",
    });
    // A typed figure wins; an engine without boost steps by its power target.
    expect(stepTarget(turbo, last, { by: "boost", boostKpa: 120 }).target).toEqual({
      boostKpa: 120,
    });
    expect(
      stepTarget({ aspiration: "na", maxBoostKpa: 0, wantedKw: 300 }, last, { by: "boost" }),
    ).toEqual({ target: { crankKw: 300 }, basis: "build-power" });
    expect(basisText("build-boost", 1, "metric")).toMatch(/^At the build's boost target, exactly/);
    expect(basisText("more-boost", 2, "imperial")).toMatch(/^2\.9 psi more than pull 2/);
  });
});
