import { SMTPServer } from "smtp-server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  call,
  freshDatabase,
  postgresCtl,
  signInAt,
  sqlFor,
  startApp,
  type App,
} from "../helpers/system";

let app: App;
let sql: ReturnType<typeof sqlFor>;
let cookie: string;
const PORT = 3204;
const SMTP_PORT = 2598; // nothing listens here until the mail test starts a server
const BUILD = "10000000-0000-4000-8000-000000000002";
beforeAll(async () => {
  sql = sqlFor(freshDatabase());
  app = await startApp(PORT, { SMTP_URL: `smtp://127.0.0.1:${SMTP_PORT}` });
  cookie = (await signInAt(app.url, "owner@demo.fuelwright.test")).cookie;
}, 120_000);
afterAll(async () => {
  await app?.stop();
  await sql?.end();
});

const api = (method: string, path: string, body?: unknown) =>
  call(app.url, cookie, method, path, body);

describe("lost updates", () => {
  it("concurrent edits of one build: exactly one wins each round, and no acknowledged save is lost", async () => {
    const acked: { version: number; note: string }[] = [];
    for (let round = 0; round < 5; round++) {
      const cur = await api("GET", `/api/v1/builds/${BUILD}`);
      const results = await Promise.all(
        Array.from({ length: 6 }, (_, i) =>
          api("PATCH", `/api/v1/builds/${BUILD}`, {
            version: cur.json.build.version,
            // Each editor changes the title: a save that changes nothing writes nothing.
            title: `round ${round} editor ${i}`,
            note: `round ${round} editor ${i}`,
            inputs: cur.json.build.inputs,
          }).then((r) => ({ r, note: `round ${round} editor ${i}` })),
        ),
      );
      const ok = results.filter((x) => x.r.status === 200);
      expect(ok, `round ${round}`).toHaveLength(1);
      expect(results.filter((x) => x.r.status === 409)).toHaveLength(5);
      acked.push({ version: ok[0]!.r.json.build.version, note: ok[0]!.note });
    }
    for (const a of acked) {
      const [rev] =
        await sql`select note from build_revisions where build_id = ${BUILD} and version = ${a.version}`;
      expect(rev?.note, `version ${a.version}`).toBe(a.note);
    }
  });

  it("saves with the app killed (SIGKILL) mid-way and restarted: every acknowledged save is there, versions match revisions", async () => {
    const acked: { version: number; note: string }[] = [];
    let version = (await api("GET", `/api/v1/builds/${BUILD}`)).json.build.version as number;
    const inputs = (await api("GET", `/api/v1/builds/${BUILD}`)).json.build.inputs;
    let kills = 0;
    for (let i = 0; i < 45; i++) {
      const note = `kill loop save ${i}`;
      const pending = api("PATCH", `/api/v1/builds/${BUILD}`, {
        version,
        title: note,
        note,
        inputs,
      }).then(
        (r) => r,
        () => null, // the connection died with the process: not acknowledged
      );
      if (i % 15 === 7) {
        // Kill while the save is in flight, somewhere between arrival and commit.
        await new Promise((r) => setTimeout(r, Math.floor(Math.random() * 15)));
        await app.kill9();
        kills++;
        const r = await pending;
        if (r?.status === 200) acked.push({ version: r.json.build.version, note });
        app = await startApp(PORT, { SMTP_URL: `smtp://127.0.0.1:${SMTP_PORT}` });
        version = (await api("GET", `/api/v1/builds/${BUILD}`)).json.build.version;
        continue;
      }
      const r = await pending;
      expect(r?.status, note).toBe(200);
      acked.push({ version: r!.json.build.version, note });
      version = r!.json.build.version;
    }
    expect(kills).toBe(3);
    for (const a of acked) {
      const [rev] =
        await sql`select note from build_revisions where build_id = ${BUILD} and version = ${a.version}`;
      expect(rev?.note, `acknowledged version ${a.version}`).toBe(a.note);
    }
    const mismatched =
      await sql`select b.id, b.version, max(r.version) as newest from builds b join build_revisions r on r.build_id = b.id group by b.id, b.version having b.version <> max(r.version)`;
    expect(mismatched).toEqual([]);
  }, 180_000);
});

describe("the database goes away", () => {
  it("requests meanwhile get a clean 503 (JSON for the API, a page for browsers), and the app recovers by itself", async () => {
    const before = await api("GET", "/api/v1/builds");
    expect(before.status, before.text.slice(0, 300)).toBe(200);
    postgresCtl("stop");
    try {
      await new Promise((r) => setTimeout(r, 1200)); // past the page probe's one-second memory
      const json = await api("GET", "/api/v1/builds");
      expect(json.status).toBe(503);
      expect(json.json.error.code).toBe("unavailable");
      expect(json.headers.get("retry-after")).toBeTruthy();
      const page = await api("GET", "/builds");
      expect(page.status).toBe(503);
      expect(page.headers.get("content-type")).toMatch(/text\/html/);
      expect(page.text).toContain("Back in a moment");
      const calc = await api("POST", "/api/v1/calc/blend", {});
      expect(calc.status).toBeLessThan(500 + 4); // 503 or a 4xx, never a 500
      expect(calc.status).not.toBe(500);
    } finally {
      postgresCtl("start");
    }
    const end = Date.now() + 30_000;
    let status = 0;
    while (Date.now() < end) {
      status = (await api("GET", "/api/v1/builds")).status;
      if (status === 200) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
    await expect
      .poll(async () => (await api("GET", "/builds")).status, { timeout: 10_000, interval: 200 })
      .toBe(200);
  }, 90_000);
});

describe("mail faults", () => {
  it("with the mail server down a quote stays unsent with a clear message; the retry sends it", async () => {
    const q = await api("POST", "/api/v1/quotes", { buildId: BUILD });
    expect(q.status).toBe(201);
    const id = q.json.quote.id;
    const [part] =
      await sql`select id, sku, name, price_minor from parts where shop_id = 'demo-shop-ridgeback' and category = 'injector' limit 1`;
    const cur = await api("GET", `/api/v1/quotes/${id}`);
    const lines = [
      {
        kind: "part",
        partId: part!.id,
        sku: part!.sku,
        description: part!.name,
        quantityMilli: 6000,
        unitPriceMinor: part!.price_minor,
      },
    ];
    const upd = await api("PATCH", `/api/v1/quotes/${id}`, {
      version: cur.json.quote.version,
      validUntil: "2099-01-31",
      lines,
    });
    expect(upd.status, upd.text).toBe(200);

    const down = await api("POST", `/api/v1/quotes/${id}/send`);
    expect(down.status).toBe(502);
    expect(down.json.error.message).toMatch(/not sent.*try again/i);
    expect((await api("GET", `/api/v1/quotes/${id}`)).json.quote.status).toBe("draft");

    const received: string[] = [];
    const smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      onData(stream, _s, done) {
        stream.on("data", (c) => received.push(String(c)));
        stream.on("end", () => done());
      },
    });
    await new Promise<void>((r) => smtp.listen(SMTP_PORT, "127.0.0.1", r));
    try {
      const retry = await api("POST", `/api/v1/quotes/${id}/send`);
      expect(retry.status, retry.text).toBe(200);
      expect((await api("GET", `/api/v1/quotes/${id}`)).json.quote.status).toBe("sent");
      expect(received.join("")).toMatch(/quote/i);
    } finally {
      await new Promise<void>((r) => smtp.close(() => r()));
    }
  });
});
