import { createHash } from "node:crypto";
import { request as httpRequest } from "node:http";

import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  DatalogMappingSchema,
  flowFromDuty,
  fuelBlend,
  FuelSystemInputSchema,
  type ShopBsfcRow,
} from "@/lib/calc";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, getBytes, request, signIn, type Client } from "../helpers/http";
import { inspectPdf } from "../helpers/pdf";

const BUILD = "10000000-0000-4000-8000-000000000002"; // demo turbo six on E85 (db/seed.ts)
const DEMO_SHOP = "demo-shop-ridgeback"; // Ridgeback Fuel & Dyno (db/seed.ts)
let tuner: Client, counter: Client, customer: Client, outsider: Client;
beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, counter, customer, outsider] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

const upload = (client: Client, body: BodyInit, headers: Record<string, string> = {}) =>
  fetch(`${BASE_URL}/api/v1/builds/${BUILD}/datalogs`, {
    method: "POST",
    body,
    headers: {
      cookie: client.cookie,
      origin: BASE_URL,
      "x-forwarded-for": client.ip,
      "content-type": "text/csv",
      "x-file-name": "pull 3.csv",
      ...headers,
    },
    duplex: "half",
  } as RequestInit);

describe("datalog uploads", () => {
  it("round trip through the S3 store: name, size, hash, uploader recorded; the same bytes come back", async () => {
    const csv = "RPM;Inj Duty;Lambda\nrpm;%;λ\n3000;41,5;0,79\n3050;42,0;0,78\n";
    const r = await upload(tuner, csv);
    expect(r.status).toBe(201);
    const { datalog } = await r.json();
    expect(datalog).toMatchObject({
      fileName: "pull 3.csv",
      sizeBytes: Buffer.byteLength(csv),
      rowCount: 2,
      headers: ["RPM", "Inj Duty", "Lambda"],
      uploadedBy: "demo-user-tuner",
    });
    expect(datalog.sha256).toBe(createHash("sha256").update(csv).digest("hex"));
    // A log that stops mid-row is kept without its partial row, and the answer says so.
    const cut = await upload(tuner, "RPM;Inj Duty;Lambda\n3000;41,5;0,79\n3050;42,0;0,78\n3100;4");
    expect(cut.status).toBe(201);
    expect(await cut.json()).toMatchObject({ cutShort: true, datalog: { rowCount: 2 } });
    const file = await getBytes(counter, `/api/v1/datalogs/${datalog.id}/file`);
    expect(file.status).toBe(200);
    expect(file.bytes.toString("utf8")).toBe(csv);
    const list = await request(counter, "GET", `/api/v1/builds/${BUILD}/datalogs`);
    expect(list.json.datalogs.map((d: { id: string }) => d.id)).toContain(datalog.id);
    expect(JSON.stringify(list.json)).not.toContain("object_key");
    // Only within the shop, and not for customers.
    expect((await getBytes(outsider, `/api/v1/datalogs/${datalog.id}/file`)).status).toBe(404);
    expect((await getBytes(customer, `/api/v1/datalogs/${datalog.id}/file`)).status).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/builds/${BUILD}/datalogs`)).status).toBe(404);
  });

  it("malformed files get a clear error and store nothing", async () => {
    const before = await fingerprint(["datalogs"]);
    const cases: [BodyInit, Record<string, string>, number, RegExp][] = [
      [new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x00, 0x01, 0x02]), {}, 415, /not a text/],
      ["", {}, 400, /empty/],
      ["   \n\n", {}, 400, /empty/],
      [
        `${Array.from({ length: 100_000 }, (_, i) => `c${i}`).join(",")}\n1,2\n`,
        {},
        422,
        /more than 500 columns/,
      ],
      ["rpm,duty\n", {}, 422, /no data rows/],
      ["rpm,duty\n3000,40\n", { "content-type": "application/pdf" }, 415, /CSV/],
    ];
    for (const [body, headers, status, message] of cases) {
      const r = await upload(tuner, body, headers);
      expect(r.status, String(message)).toBe(status);
      expect((await r.json()).error.message).toMatch(message);
    }
    // 200 MB declared: refused from its length, before it is read.
    const big = await new Promise<number>((resolve, reject) => {
      const u = new URL(`${BASE_URL}/api/v1/builds/${BUILD}/datalogs`);
      const req = httpRequest(
        {
          host: u.hostname,
          port: u.port,
          path: u.pathname,
          method: "POST",
          headers: {
            cookie: tuner.cookie,
            origin: BASE_URL,
            "x-forwarded-for": tuner.ip,
            "content-type": "text/csv",
            "content-length": 200 * 1024 * 1024,
          },
        },
        (res) => {
          resolve(res.statusCode ?? 0);
          res.resume();
          req.destroy();
        },
      );
      req.on("error", (e) => (e.message.includes("socket hang up") ? undefined : reject(e)));
      req.write("rpm,duty\n3000,40\n");
    });
    expect(big).toBe(413);
    // 21 MB really sent: refused while reading.
    const over = await upload(tuner, `rpm,duty\n${"3000,40\n".repeat(2_800_000)}`);
    expect(over.status).toBe(413);
    expect((await upload(counter, "rpm,duty\n3000,40\n")).status).toBe(403);
    expect((await upload(outsider, "rpm,duty\n3000,40\n")).status).toBe(404);
    expect(await fingerprint(["datalogs"])).toBe(before);
  });
});

/** A pull generated in the test from known values: duty 40 → 80 % over 3000–7000 rpm, lambda 0.80. */
function pullCsv(order: "a" | "b" = "a") {
  const rows = [
    order === "a"
      ? "Time;RPM;Inj Duty;Lambda;Boost;Fuel Diff"
      : "RPM;Time;Lambda;Inj Duty;Boost;Fuel Diff",
    order === "a" ? "s;rpm;%;lambda;kPa;kPa" : "rpm;s;lambda;%;kPa;kPa",
  ];
  for (let i = 0; i <= 80; i++) {
    const rpm = 3000 + i * 50;
    const duty = (40 + (40 * i) / 80).toFixed(2).replace(".", ",");
    const boost = (150 * Math.min(1, (i / 80) * 1.5)).toFixed(1).replace(".", ",");
    const t = (i * 0.05).toFixed(2).replace(".", ",");
    rows.push(
      order === "a"
        ? `${t};${rpm};${duty};0,80;${boost};300`
        : `${rpm};${t};0,80;${duty};${boost};300`,
    );
  }
  return rows.join("\n") + "\n";
}

describe("datalog analysis", () => {
  it("maps columns, analyses against the build, and remembers the mapping for the next log from the same logger", async () => {
    // Re-runnable on a kept test database: this logger starts unknown.
    await sql`delete from datalog_mappings where shop_id = 'demo-shop-ridgeback'`;
    const first = await (await upload(tuner, pullCsv("a"))).json();
    const view = await request(tuner, "GET", `/api/v1/datalogs/${first.datalog.id}`);
    expect(view.status).toBe(200);
    expect(view.json.remembered).toBe(false);
    expect(view.json.mapping).toMatchObject({
      rpm: "RPM",
      duty: { column: "Inj Duty", kind: "duty_pct" },
      mixture: { column: "Lambda", kind: "lambda" },
    });
    const mapping = {
      ...view.json.mapping,
      boost: { column: "Boost", kind: "gauge", unit: "kPa" },
      fuelPressure: { column: "Fuel Diff", kind: "differential", unit: "kPa" },
    };
    const bad = await request(tuner, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, {
      mapping: { ...mapping, duty: { column: "Nope", kind: "duty_pct" } },
    });
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues[0].path).toBe("mapping.duty.column");
    const a = await request(tuner, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, {
      mapping,
    });
    expect(a.status).toBe(200);
    expect(a.json.analysis.peakDuty.pct).toBeCloseTo(80, 6);
    expect(a.json.analysis.peakDuty.rpm).toBe(7000);
    expect(a.json.analysis.fuelPressure.dropKpa).toBeCloseTo(0, 6);
    expect(a.json.series.length).toBe(81);
    expect(a.json.series[0].dutyPredicted).toBeGreaterThan(0);
    const second = await (await upload(tuner, pullCsv("b"))).json();
    const again = await request(tuner, "GET", `/api/v1/datalogs/${second.datalog.id}`);
    expect(again.json.remembered).toBe(true);
    expect(again.json.mapping).toEqual(
      JSON.parse(JSON.stringify(DatalogMappingSchema.parse(mapping))),
    );
    expect(
      (await request(counter, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, { mapping }))
        .status,
    ).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/datalogs/${first.datalog.id}`)).status).toBe(
      404,
    );
  });
});

describe("the shop learns its own BSFC from verified builds", () => {
  /** A fitted build made from the demo turbo six (E51–E83), with a pull whose logged power puts BSFC at `bsfc`. */
  async function verifiedBuild(bsfc: number, tag: string) {
    const [demo] = await sql`select customer_id, inputs from builds where id = ${BUILD}`;
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: demo!.customer_id,
      title: `BSFC learning ${tag}`,
      inputs: demo!.inputs,
    });
    expect(made.status).toBe(201);
    const id = made.json.build.id as string;
    await sql`update builds set status = 'fitted' where id = ${id}`;
    const input = FuelSystemInputSchema.parse(demo!.inputs);
    const ctx = {
      injectorCount: input.injectors.count,
      ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
      ratedPressureKpa: input.injectors.ratedPressureKpa,
      densityKgPerL: fuelBlend(input.fuel.ethanolMaxVolPct).densityKgPerL,
      targetLambda: 0.8,
      dutyDangerPct: 90,
    };
    // Power at each sample chosen so that fuel mass flow ÷ power is `bsfc` at the top (BSFC = ṁ / P, calc-spec §1).
    const rows = ["RPM,Inj Duty,Lambda,Fuel Diff,Power", "rpm,%,lambda,kPa,kW"];
    for (let i = 0; i <= 40; i++) {
      const duty = 40 + i;
      const kw = (flowFromDuty(duty, 300, ctx).gPerMin * 60) / bsfc;
      rows.push(`${3000 + i * 100},${duty},0.80,300,${kw.toFixed(4)}`);
    }
    const up = await fetch(`${BASE_URL}/api/v1/builds/${id}/datalogs`, {
      method: "POST",
      body: rows.join("\n") + "\n",
      headers: {
        cookie: tuner.cookie,
        origin: BASE_URL,
        "x-forwarded-for": tuner.ip,
        "content-type": "text/csv",
        "x-file-name": `learn-${tag}.csv`,
      },
    });
    expect(up.status).toBe(201);
    const log = (await up.json()).datalog.id as string;
    const mapping = {
      rpm: "RPM",
      duty: { column: "Inj Duty", kind: "duty_pct" },
      mixture: { column: "Lambda", kind: "lambda" },
      fuelPressure: { column: "Fuel Diff", kind: "differential", unit: "kPa" },
      power: { column: "Power", unit: "kW" },
    };
    const a = await request(tuner, "POST", `/api/v1/datalogs/${log}/analysis`, { mapping });
    expect(a.status).toBe(200);
    expect(a.json.analysis.measuredBsfc.gPerKwh).toBeCloseTo(bsfc, 1);
    expect((await request(tuner, "POST", `/api/v1/datalogs/${log}/verify`)).status).toBe(200);
    return id;
  }
  const boostedE85 = (rows: ShopBsfcRow[]) =>
    rows.find((r) => r.fuel === "e85" && r.aspiration === "boosted") ?? {
      builds: 0,
      meanGPerKwh: 0,
    };

  it("verified builds with logged power feed the table by fuel and aspiration, within the shop only", async () => {
    const before = boostedE85((await request(tuner, "GET", "/api/v1/shop/bsfc")).json.rows);
    const tag = Date.now().toString(36);
    const a = await verifiedBuild(470, `${tag}-a`);
    await verifiedBuild(530, `${tag}-b`);
    const after = (await request(counter, "GET", "/api/v1/shop/bsfc")).json.rows as ShopBsfcRow[];
    const row = boostedE85(after);
    expect(row.builds).toBe(before.builds + 2);
    // The mean over builds (plain arithmetic, common practice, no source).
    expect(row.meanGPerKwh).toBeCloseTo(
      (before.meanGPerKwh * before.builds + 470 + 530) / (before.builds + 2),
      1,
    );
    // Other shops learn nothing from this one; customers do not read it.
    expect((await request(outsider, "GET", "/api/v1/shop/bsfc")).json.rows).toEqual([]);
    expect((await request(customer, "GET", "/api/v1/shop/bsfc")).status).toBe(403);
    // The build page offers the figure beside the rule of thumb.
    const page = await fetch(`${BASE_URL}/builds/${a}`, {
      headers: { cookie: tuner.cookie, "x-forwarded-for": tuner.ip },
    });
    const html = (await page.text()).replace(/<!-- -->/g, "");
    expect(
      html.includes(`Use this shop&#x27;s measured BSFC (${row.builds} builds)`),
      "the offer on the build page",
    ).toBe(true);
    // Settings lists the table beside the rule of thumb.
    const settings = (
      await (
        await fetch(`${BASE_URL}/settings`, {
          headers: { cookie: counter.cookie, "x-forwarded-for": counter.ip },
        })
      ).text()
    ).replace(/<!-- -->/g, "");
    expect(settings).toContain("Measured BSFC from verified builds");
    // In the reader's units (the counter's own choice, else the shop's; the demo shop's is
    // imperial): a metric reader sees g/kWh, an imperial one lb/hp/h (1 lb/(hp·h) = 608.28 g/kWh,
    // calc-spec §2), never the other.
    const [who] = await sql`select coalesce(u.unit_system, s.units) as units
      from "user" u, shop_settings s
      where u.email = 'counter@demo.fuelwright.test' and s.shop_id = ${DEMO_SHOP}`;
    const table = /Measured BSFC from verified builds[\s\S]*?<\/table>/.exec(settings)![0];
    if (who!.units === "imperial") {
      expect(table).toContain(`${(row.meanGPerKwh / 608.277).toFixed(3)} lb/hp/h`);
      expect(table).not.toMatch(/\d g\/kWh/);
    } else {
      expect(table).toContain(`${Math.round(row.meanGPerKwh)} g/kWh`);
      expect(table).not.toMatch(/lb\/hp\/h/);
    }
    // A build moved back to draft stops counting.
    const cur = await request(tuner, "GET", `/api/v1/builds/${a}`);
    expect(
      (
        await request(tuner, "PATCH", `/api/v1/builds/${a}`, {
          version: cur.json.build.version,
          status: "draft",
          inputs: cur.json.build.inputs,
        })
      ).status,
    ).toBe(200);
    expect(boostedE85((await request(tuner, "GET", "/api/v1/shop/bsfc")).json.rows).builds).toBe(
      before.builds + 1,
    );
  });

  it("a verified build's spec sheet shows the measured figures beside the predicted", async () => {
    const id = await verifiedBuild(500, `${Date.now().toString(36)}-pdf`);
    const pdf = await getBytes(counter, `/api/v1/builds/${id}/spec-sheet`);
    expect(pdf.status).toBe(200);
    const flat = inspectPdf(pdf.bytes).text.replace(/\s+/g, " ");
    expect(flat).toContain("Measured on the dyno");
    expect(flat).toMatch(/Peak injector duty [\d.]+ % at redline 80\.0 % at 7000 rpm/);
    // In the reader's units (the counter's, else the shop's): 500 g/kWh = 0.822 lb/(hp·h), as
    // 1 lb/(hp·h) = 608.28 g/kWh (calc-spec §2).
    expect(flat).toMatch(/500 g\/kWh at|0\.822 lb\/hp\/h at/);
  });
});
