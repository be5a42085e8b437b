import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { DEMO_BUILDS } from "@/db/seed";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, getBytes, request, signIn, type Client } from "../helpers/http";
import { inspectPdf } from "../helpers/pdf";
import { THREE_PULLS } from "../helpers/pulls";

// Its own build (a copy of the demo turbo six on E85, db/seed.ts: 6 × 1300 cc/min at 300 kPa,
// 400 kPa across them, power at the wheels with a 15 % loss), so other files' logs do not mix in.
// The inputs come from the seed itself: other suites edit the demo row while this one runs.
const DEMO = "10000000-0000-4000-8000-000000000002";
const DEMO_INPUTS = DEMO_BUILDS.find((b) => b.id === DEMO)!.inputs;
let BUILD = "";
let owner: Client, tuner: Client, counter: Client, customer: Client, outsider: Client;
beforeAll(async () => {
  const other = await makeOtherShop();
  [owner, tuner, counter, customer, outsider] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const [demo] = await sql`select customer_id from builds where id = ${DEMO}`;
  const made = await request(tuner, "POST", "/api/v1/builds", {
    customerId: demo!.customer_id,
    title: "Tune session test",
    inputs: DEMO_INPUTS,
  });
  expect(made.status).toBe(201);
  BUILD = made.json.build.id;
});
afterAll(async () => {
  await sql.end();
});

function addPull(
  client: Client,
  csv: string,
  q: Record<string, string | number>,
  name = "pull.csv",
) {
  const query = new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)])).toString();
  return fetch(`${BASE_URL}/api/v1/builds/${BUILD}/tune/pulls?${query}`, {
    method: "POST",
    body: csv,
    headers: {
      cookie: client.cookie,
      origin: BASE_URL,
      "x-forwarded-for": client.ip,
      "content-type": "text/csv",
      "x-file-name": name,
    },
  });
}

interface Check {
  key: string;
  status: string;
  atRpm: number | null;
  by: { value: number } | null;
  params: Record<string, { value: number }>;
}
interface Pull {
  id: string;
  position: number;
  ethanolPct: number;
  excluded: boolean;
  summary: {
    peakPower: { crankKw: number; loggedKw: number };
    measuredBsfc: { gPerKwh: number };
  };
  checks: Check[];
  logNotes: { code: string }[];
}
const session = async (c: Client = counter, q = "") =>
  (await request(c, "GET", `/api/v1/builds/${BUILD}/tune${q}`)).json as {
    pulls: Pull[];
    limitsSource: string;
    next: {
      from: string | null;
      step?: { dutyPct: number; crankKw: number; runsOutFirst: { part: string } };
    };
  };
const checkOf = (p: Pull, key: string) => p.checks.find((c) => c.key === key)!;

describe("tune sessions", () => {
  const ids: string[] = [];

  it("takes three pulls in order and judges each against the limits", async () => {
    for (const p of THREE_PULLS) {
      const r = await addPull(
        tuner,
        p.csv,
        { ethanolPct: p.ethanolPct, boostTargetKpa: p.boostTargetKpa, powerMeasuredAt: "wheel" },
        p.name,
      );
      expect(r.status, await r.clone().text()).toBe(201);
      ids.push(((await r.json()) as { pull: { id: string } }).pull.id);
    }
    const s = await session();
    expect(s.pulls.map((p) => p.id)).toEqual(ids);
    expect(s.pulls.map((p) => p.position)).toEqual([1, 2, 3]);
    expect(s.limitsSource).toBe("library");
    // λ 0.86 at 60 kPa is the table's target there: within, never "danger".
    expect(checkOf(s.pulls[0]!, "lambda").status).toBe("within");
    // Pull 3: cylinder 3 runs 100 °C over the others from 6000 rpm; 80 °C allowed → 20 over.
    const spread = checkOf(s.pulls[2]!, "egtSpread");
    expect(spread).toMatchObject({ status: "over", atRpm: 6000 });
    expect(spread.by!.value).toBe(20);
    expect(spread.params.hot!.value).toBe(3);
    expect(checkOf(s.pulls[1]!, "egtSpread").status).toBe("within");
    // Worked by hand: 360 kW at the wheels / (1 − 0.15) = 423.53 kW at the crank.
    expect(s.pulls[2]!.summary.peakPower.crankKw).toBeCloseTo(360 / 0.85, 6);
    expect(s.pulls[2]!.summary.peakPower.loggedKw).toBeCloseTo(360, 6);
    // Worked by hand: 6 × 1300 × √(400/300) cc/min × 60 % × 0.78665 kg/L (E85 of the library:
    // 0.85 × 0.794 + 0.15 × 0.745) × 60 min/h ÷ 423.53 kW = 602.2 g/kWh, at the crank.
    expect(s.pulls[2]!.summary.measuredBsfc.gPerKwh).toBeCloseTo(
      (6 * 1300 * Math.sqrt(400 / 300) * 0.6 * 0.78665 * 60) / (360 / 0.85),
      3,
    );
    // The next step comes from the last pull.
    expect(s.next.from).toBe(ids[2]);
    expect(s.next.step!.dutyPct).toBeGreaterThan(0);
    // A named boost step: power in proportion to manifold absolute pressure.
    const at200 = await session(counter, "?nextBoostKpa=200");
    // Worked by hand: 423.53 × (101.325 + 200) / (101.325 + 150) = 507.79 kW.
    expect(at200.next.step!.crankKw).toBeCloseTo(((360 / 0.85) * 301.325) / 251.325, 3);
  });

  it("prints the session on the spec sheet: best pull per fuel and what stopped the climb", async () => {
    const pdf = await getBytes(counter, `/api/v1/builds/${BUILD}/spec-sheet`);
    expect(pdf.status).toBe(200);
    const text = inspectPdf(pdf.bytes).text.replace(/\s+/g, " ");
    expect(text).toContain("Tune session");
    // E10 and E85 each have a best pull: #1 and #3 (the most crank power on E85).
    expect(text).toMatch(/#1, E10/);
    expect(text).toMatch(/#3, E85/);
    expect(text).toContain("What stopped the climb (pull #3)");
    expect(text).toMatch(/Over — EGT spread between cylinders: Cylinder 3 ran/);
  });

  it("refuses a log the mapping cannot place, naming the column, and stores nothing", async () => {
    const before = await fingerprint(["datalogs", "tune_pulls", "datalog_mappings"]);
    const r = await addPull(tuner, "Time,Speed,Throttle\n0.1,3000,80\n0.2,3100,81\n", {
      ethanolPct: 85,
      powerMeasuredAt: "crank",
    });
    expect(r.status).toBe(422);
    const body = (await r.json()) as { error: { message: string; issues: { path: string }[] } };
    expect(body.error.message).toMatch(/engine speed/);
    expect(body.error.message).toContain('"Speed"');
    expect(body.error.issues[0]!.path).toBe("mapping.rpm");
    // A mapping that names a column the log lacks: the column is named.
    const m = encodeURIComponent(
      JSON.stringify({ rpm: "Speed", duty: { column: "Inj DC", kind: "duty_pct" } }),
    );
    const r2 = await fetch(
      `${BASE_URL}/api/v1/builds/${BUILD}/tune/pulls?ethanolPct=85&powerMeasuredAt=crank&mapping=${m}`,
      {
        method: "POST",
        body: "Time,Speed,Throttle\n0.1,3000,80\n",
        headers: {
          cookie: tuner.cookie,
          origin: BASE_URL,
          "x-forwarded-for": tuner.ip,
          "content-type": "text/csv",
        },
      },
    );
    expect(r2.status).toBe(422);
    expect(((await r2.json()) as { error: { message: string } }).error.message).toContain(
      '"Inj DC"',
    );
    // Bad fields in the query string name the field.
    const r3 = await addPull(tuner, THREE_PULLS[0].csv, {
      ethanolPct: 130,
      powerMeasuredAt: "tyre",
    });
    expect(r3.status).toBe(422);
    const paths = ((await r3.json()) as { error: { issues: { path: string }[] } }).error.issues.map(
      (i) => i.path,
    );
    expect(paths).toEqual(expect.arrayContaining(["ethanolPct", "powerMeasuredAt"]));
    expect(await fingerprint(["datalogs", "tune_pulls", "datalog_mappings"])).toBe(before);
  });

  it("offers an unplaced log's columns, takes it again with the tuner's mapping, and remembers that for the logger", async () => {
    // A logger of our own invention whose names the guess cannot read.
    const csv = [
      "Tick,Crank Spd,Inj Open,WB1,Mnf P",
      "s,1/min,%,λ,psi",
      ...Array.from({ length: 21 }, (_, i) => {
        const rpm = 3000 + i * 200;
        return `${i},${rpm},${(30 + i * 2).toFixed(1)},0.86,${(i * 0.6).toFixed(1)}`;
      }),
    ].join("\n");
    const before = await fingerprint(["datalogs", "tune_pulls", "datalog_mappings"]);
    const r = await addPull(tuner, csv, { ethanolPct: 85, powerMeasuredAt: "crank" }, "odd.csv");
    expect(r.status).toBe(422);
    const body = (await r.json()) as {
      error: { code: string; message: string };
      current: { columns: string[]; units: string[]; remembered: boolean };
    };
    expect(body.error.code).toBe("unplaced_log");
    expect(body.error.message).toContain('"Crank Spd"');
    // The log's columns and their units row, for the screen's column picker.
    expect(body.current.columns).toEqual(["Tick", "Crank Spd", "Inj Open", "WB1", "Mnf P"]);
    expect(body.current.units).toEqual(["s", "1/min", "%", "λ", "psi"]);
    expect(body.current.remembered).toBe(false);
    expect(await fingerprint(["datalogs", "tune_pulls", "datalog_mappings"])).toBe(before);
    // A mapping that still lacks duty: named on its field, nothing stored.
    const half = await addPull(tuner, csv, {
      ethanolPct: 85,
      powerMeasuredAt: "crank",
      mapping: JSON.stringify({ rpm: "Crank Spd" }),
    });
    expect(half.status).toBe(422);
    const halfBody = (await half.json()) as { error: { issues: { path: string }[] } };
    expect(halfBody.error.issues.map((i) => i.path)).toContain("mapping.duty");
    expect(await fingerprint(["datalogs", "tune_pulls", "datalog_mappings"])).toBe(before);
    // The same file with the tuner's columns: added.
    const mapping = {
      rpm: "Crank Spd",
      duty: { column: "Inj Open", kind: "duty_pct" },
      mixture: { column: "WB1", kind: "lambda" },
      boost: { column: "Mnf P", kind: "gauge", unit: "psi" },
    };
    const ok = await addPull(
      tuner,
      csv,
      { ethanolPct: 85, powerMeasuredAt: "crank", mapping: JSON.stringify(mapping) },
      "odd.csv",
    );
    expect(ok.status, await ok.clone().text()).toBe(201);
    // The next log of that logger places itself.
    const again = await addPull(
      tuner,
      csv,
      { ethanolPct: 85, powerMeasuredAt: "crank" },
      "odd2.csv",
    );
    expect(again.status, await again.clone().text()).toBe(201);
    const s = await session();
    const added = s.pulls.slice(-2);
    expect(added.map((p) => p.ethanolPct)).toEqual([85, 85]);
    for (const p of added) await request(tuner, "DELETE", `/api/v1/tune-pulls/${p.id}`);
  });

  it("judges limits field by field: the build's own over the shop's defaults (Settings API, owner only)", async () => {
    const limitsNow = async () =>
      (await request(tuner, "GET", `/api/v1/builds/${BUILD}/tune`)).json as {
        limits: Record<string, unknown>;
        limitSources: Record<string, string>;
        limitsSource: string;
      };
    // The shop's defaults through the settings API: the owner only, any of the fields.
    expect(
      (await request(tuner, "PATCH", "/api/v1/shop/settings", { tuneLimits: { maxDutyPct: 85 } }))
        .status,
    ).toBe(403);
    const set = await request(owner, "PATCH", "/api/v1/shop/settings", {
      tuneLimits: { maxDutyPct: 85 },
    });
    expect(set.status).toBe(200);
    expect(set.json.settings.tuneLimits.maxDutyPct).toBe(85);
    expect(set.json.settings.tuneLimits.maxEgtC).toBe(950);
    const bad = await request(owner, "PATCH", "/api/v1/shop/settings", {
      tuneLimits: { maxEgtC: 5000 },
    });
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues[0].path).toBe("tuneLimits.maxEgtC");
    // The same again writes nothing.
    const settingsBefore = await fingerprint(["shop_settings"]);
    expect(
      (await request(owner, "PATCH", "/api/v1/shop/settings", { tuneLimits: { maxDutyPct: 85 } }))
        .status,
    ).toBe(200);
    expect(await fingerprint(["shop_settings"])).toBe(settingsBefore);

    // The build sets only its EGT: that field is its own, the rest the shop's.
    const own = await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, {
      limits: { maxEgtC: 900 },
    });
    expect(own.status).toBe(200);
    let l = await limitsNow();
    expect(l.limitSources.maxEgtC).toBe("build");
    expect(l.limitSources.maxDutyPct).toBe("shop");
    expect(l.limitsSource).toBe("build");
    expect(l.limits.maxDutyPct).toBe(85);
    // The shop changes its duty: the build follows, its own EGT stays.
    await request(owner, "PATCH", "/api/v1/shop/settings", { tuneLimits: { maxDutyPct: 88 } });
    l = await limitsNow();
    expect([l.limits.maxDutyPct, l.limits.maxEgtC]).toEqual([88, 900]);
    // Sent back to the shop's value: the field follows the shop again.
    await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, { limits: { maxEgtC: 950 } });
    l = await limitsNow();
    expect(l.limitSources.maxEgtC).toBe("shop");
    expect(l.limitsSource).toBe("shop");
    // Back to the library's.
    expect(
      (await request(owner, "PATCH", "/api/v1/shop/settings", { tuneLimits: null })).status,
    ).toBe(200);
    expect((await limitsNow()).limitsSource).toBe("library");
    expect((await request(owner, "GET", "/api/v1/shop/settings")).json.settings.tuneLimits).toBe(
      null,
    );
  });

  it("excludes a pull (the next step moves back) and deletes one with its log", async () => {
    const ex = await request(tuner, "PATCH", `/api/v1/tune-pulls/${ids[2]}`, { excluded: true });
    expect(ex.status).toBe(200);
    expect(ex.json.pull.excluded).toBe(true);
    let s = await session();
    expect(s.pulls).toHaveLength(3);
    expect(s.next.from).toBe(ids[1]);
    // The same again writes nothing.
    const before = await fingerprint(["tune_pulls"]);
    expect(
      (await request(tuner, "PATCH", `/api/v1/tune-pulls/${ids[2]}`, { excluded: true })).status,
    ).toBe(200);
    expect(await fingerprint(["tune_pulls"])).toBe(before);
    // A new fuel measures the log again: BSFC follows the density.
    const e100 = await request(tuner, "PATCH", `/api/v1/tune-pulls/${ids[1]}`, { ethanolPct: 100 });
    expect(e100.status).toBe(200);
    const [log] = await sql<
      { datalog_id: string }[]
    >`select datalog_id from tune_pulls where id = ${ids[1]!}`;
    // Others cannot touch it.
    expect((await request(counter, "DELETE", `/api/v1/tune-pulls/${ids[1]}`)).status).toBe(403);
    expect((await request(outsider, "DELETE", `/api/v1/tune-pulls/${ids[1]}`)).status).toBe(404);
    expect((await request(tuner, "DELETE", `/api/v1/tune-pulls/${ids[1]}`)).status).toBe(204);
    s = await session();
    expect(s.pulls.map((p) => p.id)).toEqual([ids[0], ids[2]]);
    expect((await sql`select 1 from datalogs where id = ${log!.datalog_id}`).length).toBe(0);
    expect((await request(tuner, "DELETE", `/api/v1/tune-pulls/${ids[1]}`)).status).toBe(404);
  });

  it("keeps the session to the shop's staff", async () => {
    expect((await request(customer, "GET", `/api/v1/builds/${BUILD}/tune`)).status).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/builds/${BUILD}/tune`)).status).toBe(404);
    const r = await addPull(counter, THREE_PULLS[0].csv, {
      ethanolPct: 10,
      powerMeasuredAt: "wheel",
    });
    expect(r.status).toBe(403);
  });

  it("takes the build's own limits, and the shop's only from the owner", async () => {
    const limits = {
      lambdaTargets: [
        { boostKpa: 0, lambda: 0.9 },
        { boostKpa: 150, lambda: 0.8 },
      ],
      lambdaLeanAllowance: 0.03,
      maxDutyPct: 90,
      maxEgtC: 950,
      maxEgtSpreadC: 120,
      maxBackPressureRatio: 2,
      maxTurboRpm: null,
      nearPct: 5,
    };
    const r = await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, { limits });
    expect(r.status).toBe(200);
    let s = await session();
    expect(s.limitsSource).toBe("build");
    expect(checkOf(s.pulls[1]!, "egtSpread").status).toBe("within");
    expect(
      (await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, { limits, scope: "shop" }))
        .status,
    ).toBe(403);
    const bad = await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, {
      limits: { ...limits, maxDutyPct: 140 },
    });
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues[0].path).toBe("limits.maxDutyPct");
    expect(
      (await request(tuner, "PATCH", `/api/v1/builds/${BUILD}/tune`, { limits: null })).status,
    ).toBe(200);
    s = await session();
    expect(s.limitsSource).toBe("library");
    expect(
      (await request(owner, "PATCH", `/api/v1/builds/${BUILD}/tune`, { limits, scope: "shop" }))
        .status,
    ).toBe(200);
    expect((await session()).limitsSource).toBe("shop");
    await sql`update shop_settings set tune_limits = null where tune_limits is not null`;
  });

  it("copies the build as the next power step, linked back", async () => {
    const r = await request(tuner, "POST", `/api/v1/builds/${BUILD}/next-step`, {
      powerKw: 400,
      pullId: ids[2],
    });
    expect(r.status).toBe(201);
    expect(r.json.build.previousStepId).toBe(BUILD);
    expect(r.json.build.inputs.target.powerKw).toBe(400);
    expect(
      (await request(counter, "POST", `/api/v1/builds/${BUILD}/next-step`, { powerKw: 400 }))
        .status,
    ).toBe(403);
  });
});
