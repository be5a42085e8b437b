import { createHash } from "node:crypto";
import { request as httpRequest } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { DatalogMappingSchema } from "@/lib/calc";
import { BASE_URL, getBytes, request, signIn, type Client } from "../helpers/http";

const BUILD = "10000000-0000-4000-8000-000000000002"; // demo turbo six on E85 (db/seed.ts)
let tuner: Client, counter: Client, customer: Client, outsider: Client;
beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, counter, customer, outsider] = await Promise.all([signIn("tuner@demo.fuelwright.test"), signIn("counter@demo.fuelwright.test"), signIn("customer@demo.fuelwright.test"), signIn(other.email, other.password)]);
});
afterAll(async () => {
  await sql.end();
});

const upload = (client: Client, body: BodyInit, headers: Record<string, string> = {}) =>
  fetch(`${BASE_URL}/api/v1/builds/${BUILD}/datalogs`, { method: "POST", body, headers: { cookie: client.cookie, origin: BASE_URL, "x-forwarded-for": client.ip, "content-type": "text/csv", "x-file-name": "pull 3.csv", ...headers }, duplex: "half" } as RequestInit);

describe("datalog uploads", () => {
  it("round trip through the S3 store: name, size, hash, uploader recorded; the same bytes come back", async () => {
    const csv = "RPM;Inj Duty;Lambda\nrpm;%;λ\n3000;41,5;0,79\n3050;42,0;0,78\n";
    const r = await upload(tuner, csv);
    expect(r.status).toBe(201);
    const { datalog } = await r.json();
    expect(datalog).toMatchObject({ fileName: "pull 3.csv", sizeBytes: Buffer.byteLength(csv), rowCount: 2, headers: ["RPM", "Inj Duty", "Lambda"], uploadedBy: "demo-user-tuner" });
    expect(datalog.sha256).toBe(createHash("sha256").update(csv).digest("hex"));
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
      [`${Array.from({ length: 100_000 }, (_, i) => `c${i}`).join(",")}\n1,2\n`, {}, 422, /more than 500 columns/],
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
      const req = httpRequest({ host: u.hostname, port: u.port, path: u.pathname, method: "POST", headers: { cookie: tuner.cookie, origin: BASE_URL, "x-forwarded-for": tuner.ip, "content-type": "text/csv", "content-length": 200 * 1024 * 1024 } }, (res) => {
        resolve(res.statusCode ?? 0);
        res.resume();
        req.destroy();
      });
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
  const rows = [order === "a" ? "Time;RPM;Inj Duty;Lambda;Boost;Fuel Diff" : "RPM;Time;Lambda;Inj Duty;Boost;Fuel Diff", order === "a" ? "s;rpm;%;lambda;kPa;kPa" : "rpm;s;lambda;%;kPa;kPa"];
  for (let i = 0; i <= 80; i++) {
    const rpm = 3000 + i * 50;
    const duty = (40 + (40 * i) / 80).toFixed(2).replace(".", ",");
    const boost = (150 * Math.min(1, (i / 80) * 1.5)).toFixed(1).replace(".", ",");
    const t = (i * 0.05).toFixed(2).replace(".", ",");
    rows.push(order === "a" ? `${t};${rpm};${duty};0,80;${boost};300` : `${rpm};${t};0,80;${duty};${boost};300`);
  }
  return rows.join("\n") + "\n";
}

describe("datalog analysis", () => {
  it("maps columns, analyses against the build, and remembers the mapping for the next log from the same logger", async () => {
    const first = await (await upload(tuner, pullCsv("a"))).json();
    const view = await request(tuner, "GET", `/api/v1/datalogs/${first.datalog.id}`);
    expect(view.status).toBe(200);
    expect(view.json.remembered).toBe(false);
    expect(view.json.mapping).toMatchObject({ rpm: "RPM", duty: { column: "Inj Duty", kind: "duty_pct" }, mixture: { column: "Lambda", kind: "lambda" } });
    const mapping = { ...view.json.mapping, boost: { column: "Boost", kind: "gauge", unit: "kPa" }, fuelPressure: { column: "Fuel Diff", kind: "differential", unit: "kPa" } };
    const bad = await request(tuner, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, { mapping: { ...mapping, duty: { column: "Nope", kind: "duty_pct" } } });
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues[0].path).toBe("mapping.duty.column");
    const a = await request(tuner, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, { mapping });
    expect(a.status).toBe(200);
    expect(a.json.analysis.peakDuty.pct).toBeCloseTo(80, 6);
    expect(a.json.analysis.peakDuty.rpm).toBe(7000);
    expect(a.json.analysis.fuelPressure.dropKpa).toBeCloseTo(0, 6);
    expect(a.json.series.length).toBe(81);
    expect(a.json.series[0].dutyPredicted).toBeGreaterThan(0);
    const second = await (await upload(tuner, pullCsv("b"))).json();
    const again = await request(tuner, "GET", `/api/v1/datalogs/${second.datalog.id}`);
    expect(again.json.remembered).toBe(true);
    expect(again.json.mapping).toEqual(JSON.parse(JSON.stringify(DatalogMappingSchema.parse(mapping))));
    expect((await request(counter, "POST", `/api/v1/datalogs/${first.datalog.id}/analysis`, { mapping })).status).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/datalogs/${first.datalog.id}`)).status).toBe(404);
  });
});
