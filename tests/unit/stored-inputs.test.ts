import { describe, expect, it } from "vitest";

import {
  INPUTS_SCHEMA_VERSION,
  readStoredInputs,
  sizeForSave,
  StoredInputsError,
} from "@/lib/builds/stored-inputs";
import { FuelSystemInputSchema } from "@/lib/calc";
import { Unavailable } from "@/lib/domain/errors";
import { LIBRARY_SIZING_SETTINGS } from "@/lib/sizing/effective-inputs";

import { boostedSix } from "../calc/fixtures";

describe("readStoredInputs", () => {
  it("reads format 1 with today's schema, defaults filled in (what it stated stays stated)", () => {
    const got = readStoredInputs({ inputs: boostedSix, inputsSchemaVersion: 1 });
    expect(got).toEqual(FuelSystemInputSchema.parse(boostedSix));
    // A default the stored inputs left out (lib/calc/schema.ts: intake air 30 °C).
    expect(got.engine.intakeTempC).toBe(30);
  });

  it("reads back what a save writes, unchanged", () => {
    const written = sizeForSave(LIBRARY_SIZING_SETTINGS, boostedSix);
    expect(written.inputsSchemaVersion).toBe(INPUTS_SCHEMA_VERSION);
    expect(readStoredInputs(written)).toEqual(written.inputs);
    expect(written.sizingSettings).toEqual(LIBRARY_SIZING_SETTINGS);
  });

  it("refuses inputs written by a newer version of the product, saying so", () => {
    const read = () =>
      readStoredInputs({ inputs: boostedSix, inputsSchemaVersion: INPUTS_SCHEMA_VERSION + 1 });
    expect(read).toThrow(Unavailable);
    expect(read).toThrow(
      /newer version of Fuelwright \(inputs format 4; this server reads up to 3\)/,
    );
  });

  it("reads format 2's filter drop on the feed line as the post-pump filter (docs/calculations.md §4.5)", () => {
    const { filters, ...rest } = boostedSix;
    void filters;
    const format2 = {
      ...rest,
      lines: {
        feed: { ...boostedSix.lines!.feed!, filterDropKpa: 10 },
        return: { ...boostedSix.lines!.return!, filterDropKpa: 4 },
      },
    };
    const got = readStoredInputs({ inputs: format2, inputsSchemaVersion: 2 });
    expect(got.filters).toEqual({ prePumpDropKpa: 0, postPumpDropKpa: 10 });
    expect(got.lines!.feed).not.toHaveProperty("filterDropKpa");
    expect(got).toEqual(FuelSystemInputSchema.parse(boostedSix));
    // The same figures as before the upgrade: the pump works against rail + 10 kPa + the line.
    const sized = sizeForSave(LIBRARY_SIZING_SETTINGS, got).result;
    const outlet = sized.trace.find((s) => s.id === "pump-outlet")!;
    expect(outlet.inputs.find((i) => i.label === "post-pump filter drop")!.value).toBe(10);
    // Without a stated drop nothing is made up; format 3 is read as it is.
    const bare = readStoredInputs({
      inputs: { ...rest, lines: { feed: boostedSix.lines!.feed } },
      inputsSchemaVersion: 2,
    });
    expect(bare.filters).toEqual({ prePumpDropKpa: 0, postPumpDropKpa: 0 });
    expect(readStoredInputs({ inputs: boostedSix, inputsSchemaVersion: 3 })).toEqual(got);
  });

  it("refuses a format it never wrote", () => {
    for (const v of [0, -1, 1.5, Number.NaN])
      expect(() => readStoredInputs({ inputs: boostedSix, inputsSchemaVersion: v })).toThrow(
        StoredInputsError,
      );
  });

  it("refuses stored inputs that do not parse at their format, with the cause kept", () => {
    const broken = { ...boostedSix, injectors: { ...boostedSix.injectors, count: 0 } };
    let err: unknown;
    try {
      readStoredInputs({ inputs: broken, inputsSchemaVersion: 1 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(StoredInputsError);
    expect((err as Error).message).toBe("Stored inputs (format 1) do not parse");
    expect(String((err as Error).cause)).toMatch(/Injector count/);
  });

  it("does not mutate the stored inputs", () => {
    const stored = structuredClone(boostedSix);
    readStoredInputs({ inputs: stored, inputsSchemaVersion: 1 });
    expect(stored).toEqual(boostedSix);
  });
});
