import { describe, expect, it } from "vitest";

import { engineFromText } from "@/lib/domain/engine-text";

// Engine names as callers say them (invented vehicles; the readings are common trade usage).
describe("the engine a caller names (goal form prefill)", () => {
  it("reads displacement, cylinders and aspiration where the text says them", () => {
    expect(engineFromText("4.4 twin-turbo V8")).toEqual({
      displacementL: 4.4,
      cylinders: 8,
      aspiration: "turbo",
    });
    expect(engineFromText("3.0 turbo inline-six")).toEqual({
      displacementL: 3,
      cylinders: 6,
      aspiration: "turbo",
    });
    expect(engineFromText("3.5 supercharged V6")).toEqual({
      displacementL: 3.5,
      cylinders: 6,
      aspiration: "supercharged",
    });
    expect(engineFromText("2.0L flat-four, naturally aspirated")).toEqual({
      displacementL: 2,
      cylinders: 4,
      aspiration: "na",
    });
    expect(engineFromText("5700cc V8")).toEqual({ displacementL: 5.7, cylinders: 8 });
  });

  it("leaves out what the text does not say", () => {
    expect(engineFromText("")).toEqual({});
    expect(engineFromText("the big one")).toEqual({});
    expect(engineFromText("V8")).toEqual({ cylinders: 8 });
    expect(engineFromText("1.8 turbo")).toEqual({ displacementL: 1.8, aspiration: "turbo" });
  });
});
