import { beforeAll, describe, expect, it } from "vitest";

import { boostedSix } from "../calc/fixtures";
import { request, signIn, type Client } from "../helpers/http";

let tuner: Client;
beforeAll(async () => {
  tuner = await signIn("tuner@demo.fuelwright.test");
});

describe("POST /api/v1/calc/size", () => {
  it("sizes a valid build and returns chart series", async () => {
    const r = await request(tuner, "POST", "/api/v1/calc/size", boostedSix);
    expect(r.status).toBe(200);
    expect(r.json.result.injector.dutyPct).toBeGreaterThan(0);
    expect(r.json.result.trace.length).toBeGreaterThan(10);
    expect(r.json.charts.dutyVsRpm.length).toBeGreaterThan(2);
  });

  it.each([
    [
      "a string where a number goes",
      { ...boostedSix, engine: { ...boostedSix.engine, cylinders: "six" } },
      "engine.cylinders",
    ],
    [
      "a negative injector count",
      { ...boostedSix, injectors: { ...boostedSix.injectors, count: -4 } },
      "injectors.count",
    ],
    [
      "a huge base pressure",
      { ...boostedSix, regulator: { type: "fixed", basePressureKpa: 1e308 } },
      "regulator.basePressureKpa",
    ],
    ["a missing section", { ...boostedSix, pumps: undefined }, "pumps"],
    [
      "a wrong enum",
      { ...boostedSix, regulator: { type: "magic", basePressureKpa: 300 } },
      "regulator.type",
    ],
  ])("answers 422 naming the field for %s", async (_name, body, path) => {
    const r = await request(tuner, "POST", "/api/v1/calc/size", body);
    expect(r.status).toBe(422);
    expect(r.json.error.issues.map((i: { path: string }) => i.path)).toContain(path);
  });

  it("answers 4xx, never 500, to junk bodies", async () => {
    for (const body of [
      "",
      "null",
      "[]",
      '"text"',
      "{",
      JSON.stringify({ __proto__: { polluted: true }, constructor: { prototype: { x: 1 } } }),
    ]) {
      const r = await request(tuner, "POST", "/api/v1/calc/size", body, {
        "content-type": "application/json",
      });
      expect(r.status, body).toBeGreaterThanOrEqual(400);
      expect(r.status, body).toBeLessThan(500);
      expect(r.json.error.code).toBeTruthy();
    }
  });

  it("refuses a 5 MB body with 413", async () => {
    const r = await request(
      tuner,
      "POST",
      "/api/v1/calc/size",
      JSON.stringify({ junk: "x".repeat(5 * 1024 * 1024) }),
      { "content-type": "application/json" },
    );
    expect(r.status).toBe(413);
  });

  it("needs a signed-in member", async () => {
    expect((await request(null, "POST", "/api/v1/calc/size", boostedSix)).status).toBe(401);
  });
});

describe("POST /api/v1/calc/blend", () => {
  it("solves the volume to add", async () => {
    // By hand: 20·40/35 = 22.857 L (calc-spec §1 volume balance).
    const r = await request(tuner, "POST", "/api/v1/calc/blend", {
      kind: "volume-to-add",
      tankVolumeL: 20,
      tankEthanolVolPct: 10,
      addedEthanolVolPct: 85,
      targetEthanolVolPct: 50,
    });
    expect(r.status).toBe(200);
    expect(r.json.result.volumeL).toBeCloseTo(22.857, 3);
  });
  it("answers an unreachable target as an explained result, not an error", async () => {
    const r = await request(tuner, "POST", "/api/v1/calc/blend", {
      kind: "volume-to-add",
      tankVolumeL: 20,
      tankEthanolVolPct: 10,
      addedEthanolVolPct: 30,
      targetEthanolVolPct: 50,
    });
    expect(r.status).toBe(200);
    expect(r.json.result).toMatchObject({ ok: false, code: "target-unreachable" });
  });
  it("names the field of a bad flex-sensor reading", async () => {
    const r = await request(tuner, "POST", "/api/v1/calc/blend", {
      kind: "flex-sensor",
      frequencyHz: 400,
    });
    expect(r.status).toBe(422);
    expect(r.json.error.issues[0].path).toBe("frequencyHz");
  });
});
