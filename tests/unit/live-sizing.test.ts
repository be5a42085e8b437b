import { describe, expect, it } from "vitest";

import { boostMissing, LiveSizing } from "@/components/builds/live-sizing";
import type { FuelSystemInput } from "@/lib/calc";
import { sizingSettingsOf } from "@/lib/sizing/fill-inputs";

import { boostedSix } from "../calc/fixtures";
import { NEW_SHOP_COLUMNS } from "../helpers/settings-shop";

/**
 * The build sheet's live store: a cleared boost on a boosted engine is a message on the Boost
 * field and nothing sized (so the sheet cannot save it as 0), never a silent 0.
 */
type Values = { title: string; inputs: FuelSystemInput };
const store = (inputs: FuelSystemInput) =>
  new LiveSizing<Values>(
    {
      units: "imperial",
      settings: sizingSettingsOf(NEW_SHOP_COLUMNS),
      toInputs: (v) => v.inputs,
    },
    { title: "Boost check", inputs },
  );
const withBoost = (maxBoostKpa: unknown, aspiration?: string) =>
  ({
    ...boostedSix,
    engine: { ...boostedSix.engine, maxBoostKpa, ...(aspiration ? { aspiration } : {}) },
  }) as unknown as FuelSystemInput;

describe("a blank boost on a boosted engine", () => {
  it("is a message on the Boost field and nothing is sized", () => {
    expect(boostedSix.engine.aspiration).not.toBe("na");
    const s = store(withBoost(undefined)).get();
    expect(s.errors["engine.maxBoostKpa"]).toBe(
      "Boost is required for a turbocharged or supercharged engine",
    );
    expect(s.sized).toBeNull();
  });

  it("a stated boost sizes as before; a naturally aspirated engine needs none", () => {
    const boosted = store(boostedSix as FuelSystemInput).get();
    expect(boosted.sized).not.toBeNull();
    expect(boosted.errors["engine.maxBoostKpa"]).toBeUndefined();
    expect(boostMissing(withBoost(undefined, "na"))).toBeUndefined();
    expect(boostMissing(withBoost(0))).toBeUndefined(); // 0 typed is the person's own answer
    expect(boostMissing(withBoost(Number.NaN))).toBeDefined();
  });
});
