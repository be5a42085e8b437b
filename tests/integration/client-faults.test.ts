import { DeleteObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, type ActionRef } from "../helpers/actions";
import { appTables, changedTables, sql, tableHashes } from "../helpers/db";
import { BASE_URL, request, signIn, type Client } from "../helpers/http";
import { makeFixtures, type Fx } from "../helpers/surface";

/**
 * Input that is the client's fault answered as such (4xx), never as a server error (500) or an
 * outage (503): dates no calendar or database holds, server-action requests that cannot be
 * decoded, addresses with a broken % escape, and a stored file that is gone.
 */
let owner: Client;
let fx: Fx;
let tables: string[];

beforeAll(async () => {
  owner = await signIn("owner@demo.fuelwright.test");
  const [tuner, counter] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
  ]);
  fx = await makeFixtures({ tuner, counter });
  tables = await appTables();
}, 120_000);

afterAll(async () => {
  await sql.end();
});

const actionRef = (name: string, page: string): ActionRef => {
  const found = actionManifest().find((m) => m.name === name);
  expect(found, name).toBeTruthy();
  return { ...found!, page };
};

describe("dates", () => {
  // PostgreSQL's date has no year 0 (PostgreSQL 16 manual, 8.5.1: "4713 BC" to "5874897 AD",
  // with no year zero); 10000 and beyond do not fit YYYY-MM-DD.
  const BAD = [
    "0000-01-01",
    "0000-00-00",
    "10000-01-01",
    "1899-12-31",
    "2023-02-29",
    "-0001-01-01",
  ];

  it("a quote's validity of year 0, 10000, a day that does not exist: 422 on validUntil, nothing changed", async () => {
    const ref = actionRef("editQuoteAction", `/quotes/${fx.quote}`);
    for (const validUntil of BAD) {
      const before = await tableHashes(tables);
      const res = await request(owner, "PATCH", `/api/v1/quotes/${fx.quote}`, {
        version: 1,
        validUntil,
      });
      expect(res.status, validUntil).toBe(422);
      expect(
        res.json.error.issues.map((i: { path: string }) => i.path),
        validUntil,
      ).toEqual(["validUntil"]);
      const r = await callAction(owner, ref, [
        { ok: false },
        { id: fx.quote, version: 1, validUntil },
      ]);
      expect(r.http, validUntil).toBe(200);
      expect(r.state, validUntil).toMatchObject({ ok: false, status: 422 });
      expect(
        Object.keys((r.state as unknown as { fieldErrors: object }).fieldErrors),
        validUntil,
      ).toEqual(["validUntil"]);
      expect(changedTables(before, await tableHashes(tables)), validUntil).toEqual([]);
    }
  });

  it("the last day the field takes is kept as it was given", async () => {
    const res = await request(owner, "PATCH", `/api/v1/quotes/${fx.quote}`, {
      version: 1,
      validUntil: "9999-12-31",
    });
    expect(res.status).toBe(200);
    expect(res.json.quote.validUntil).toBe("9999-12-31");
  });

  it("a build list cursor naming year 0 or 275760 starts from the top instead of failing", async () => {
    for (const at of ["0000-01-01T00:00:00.000Z", "+275760-09-13T00:00:00.000Z", "-000001-01-01"]) {
      const cursor = Buffer.from(JSON.stringify([at, fx.build])).toString("base64url");
      const res = await request(owner, "GET", `/api/v1/builds?cursor=${cursor}`);
      expect(res.status, at).toBe(200);
      expect(res.json.builds.length, at).toBeGreaterThan(0);
    }
  });
});

describe("server-action requests that cannot be decoded", () => {
  const post = async (path: string, headers: Record<string, string>, body: BodyInit) => {
    const res = await fetch(`${BASE_URL}${path}`, {
      method: "POST",
      redirect: "manual",
      headers: {
        cookie: owner.cookie,
        "x-forwarded-for": owner.ip,
        origin: BASE_URL,
        accept: "text/x-component",
        ...headers,
      },
      body,
    });
    return { status: res.status, headers: res.headers, text: await res.text() };
  };

  it("bad JSON, garbled multipart, a missing part, arguments that are no list: 400, nothing run", async () => {
    const ref = actionRef("createCustomerAction", "/customers");
    const call = { "next-action": ref.id };
    const cases: [string, Record<string, string>, string][] = [
      [
        "bad JSON",
        { ...call, "content-type": "text/plain;charset=UTF-8" },
        '[{"ok":false},{"name":',
      ],
      ["no list", { ...call, "content-type": "text/plain;charset=UTF-8" }, '{"name":"x"}'],
      [
        "a missing part",
        { ...call, "content-type": "text/plain;charset=UTF-8" },
        '[{"ok":false},"$Q5"]',
      ],
      [
        "garbled multipart",
        { ...call, "content-type": "multipart/form-data; boundary=B" },
        '--B\r\nContent-Disposition: form-data; name="0"\r\n\r\n[]\r\n--',
      ],
      ["multipart with no boundary", { ...call, "content-type": "multipart/form-data" }, "0=[]"],
      [
        "a form without scripts, garbled",
        { "content-type": "multipart/form-data; boundary=B" },
        `--B\r\nContent-Disposition: form-data; name="$ACTION_ID_${ref.id}"\r\n\r\n\r\n--B`,
      ],
    ];
    for (const [label, headers, body] of cases) {
      const before = await tableHashes(tables);
      const res = await post(ref.page, headers, body);
      expect(res.status, `${label}: ${res.text.slice(0, 200)}`).toBe(400);
      expect(JSON.parse(res.text).error.code, label).toBe("bad_action");
      expect(changedTables(before, await tableHashes(tables)), label).toEqual([]);
    }
  });

  it("an action id the build does not know: the framework's 4xx that tells the page to reload", async () => {
    for (const [id, status] of [
      ["7f00000000000000000000000000000000000000aa", 409], // well-formed: another deployment's
      ["zzz", 400], // not an action id at all
    ] as const) {
      const res = await post(
        "/customers",
        { "next-action": id, "content-type": "text/plain;charset=UTF-8" },
        '[{"ok":false},{}]',
      );
      expect(res.status, id).toBe(status);
      expect(res.headers.get("x-nextjs-action-not-found"), id).toBe("1");
    }
  });

  it("what React's encoder sends still goes through (a refusal here is the action's own)", async () => {
    const r = await callAction(owner, actionRef("createCustomerAction", "/customers"), [
      { ok: false },
      { name: "" },
    ]);
    expect(r.http).toBe(200);
    expect(r.state).toMatchObject({ ok: false, status: 422 });
  });
});

describe("addresses with a broken % escape", () => {
  it("pages answer a 400 page, the API a 400 in its JSON shape", async () => {
    for (const path of ["/builds/%E0%A4%A", "/customers/%zz", "/share/%zz/pdf", "/%"]) {
      const res = await request(owner, "GET", path);
      expect(res.status, path).toBe(400);
      expect(res.headers.get("content-type"), path).toMatch(/text\/html/);
      expect(res.text, path).toMatch(/Not a valid address/);
    }
    for (const path of ["/api/v1/builds/%zz", "/api/v1/builds/%E0%A4%A/kit", "/api/v1/quotes/%"]) {
      const res = await request(owner, "GET", path);
      expect(res.status, path).toBe(400);
      expect(res.json.error.code, path).toBe("bad_path");
    }
    const before = await tableHashes(tables);
    const del = await request(owner, "DELETE", "/api/v1/customers/%zz");
    expect(del.status).toBe(400);
    expect(changedTables(before, await tableHashes(tables))).toEqual([]);
  });
});

describe("a stored file that is gone", () => {
  it("a datalog whose object is missing from storage is 404, not a storage outage", async () => {
    const [d] = await sql`select object_key from datalogs where id = ${fx.datalog}`;
    const s3 = new S3Client({
      endpoint: process.env.S3_ENDPOINT ?? "http://127.0.0.1:4579",
      region: "us-east-1",
      forcePathStyle: true,
      credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    });
    await s3.send(
      new DeleteObjectCommand({ Bucket: "fuelwright-uploads", Key: d!.object_key as string }),
    );
    for (const [method, path, body] of [
      ["GET", `/api/v1/datalogs/${fx.datalog}/file`, undefined],
      ["GET", `/api/v1/datalogs/${fx.datalog}`, undefined],
      [
        "POST",
        `/api/v1/datalogs/${fx.datalog}/analysis`,
        { mapping: { rpm: "rpm", duty: { column: "duty", kind: "duty_pct" } } },
      ],
    ] as const) {
      const res = await request(owner, method, path, body);
      expect(res.status, path).toBe(404);
      expect(res.json.error.code, path).toBe("not_found");
    }
  });
});
