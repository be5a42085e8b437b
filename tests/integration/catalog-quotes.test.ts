import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { waitForMail } from "../helpers/mail";

let counter: Client, tuner: Client, customer: Client, outsider: Client;
const tag = `T${Date.now().toString(36).toUpperCase()}`;
const HEADER =
  "sku,category,brand,name,price,cost,stock,reorder_level,flow_cc_min,rated_kpa,min_pulse_ms,ethanol_ok,pump_curve,mounting,an_dash,inside_mm";
const csvPost = (c: Client, body: string, dry = false) =>
  request(c, "POST", `/api/v1/parts/import${dry ? "?dryRun=1" : ""}`, body, {
    "content-type": "text/csv",
  });

beforeAll(async () => {
  const other = await makeOtherShop();
  [counter, tuner, customer, outsider] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

describe("catalog CSV import", () => {
  it("is all or nothing, and names every bad row by line and column", async () => {
    const before = await fingerprint(["parts"]);
    const csv = [
      HEADER,
      `${tag}-A,injector,Testbrand,Good injector,189.00,110,10,2,1000,300,1.0,yes,,,,`,
      `${tag}-B,injector,Testbrand,Bad price,abc,,4,,1000,300,,yes,,,,`,
      `${tag}-C,carburettor,Testbrand,Unknown category,10,,1,,,,,,,,,`,
      "",
      `${tag}-A,line,Testbrand,Same SKU again,20,,5,,,,,yes,,,6,8.7`,
      `${tag}-E,pump,Testbrand,Pump without curve,199,,2,,,,,yes,,in-tank,,`,
    ].join("\n");
    const r = await csvPost(counter, csv);
    expect(r.status).toBe(422);
    const rows = r.json.error.rows as { line: number; field: string; message: string }[];
    expect(rows).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: 3, field: "price" }),
        expect.objectContaining({ line: 4, field: "category" }),
        expect.objectContaining({
          line: 6,
          field: "sku",
          message: expect.stringContaining("line 2"),
        }),
        expect.objectContaining({ line: 7, field: "pump_curve" }),
      ]),
    );
    expect(rows.some((e) => e.line === 2)).toBe(false);
    expect(await fingerprint(["parts"])).toBe(before);
  });

  it("previews without writing, then imports every row and updates known SKUs; export reads back", async () => {
    const csv = [
      HEADER,
      `${tag}-P,pump,Testbrand,Good pump,249.50,150,3,1,,,,yes,13.5V 300:400 500:340 700:270,in-tank,,`,
      `${tag}-H,line,Testbrand,Hose,24,,50,10,,,,yes,,,8,10.3`,
    ].join("\r\n");
    const before = await fingerprint(["parts"]);
    const dry = await csvPost(counter, csv, true);
    expect(dry.status).toBe(200);
    expect(dry.json.preview.map((p: { action: string }) => p.action)).toEqual(["add", "add"]);
    expect(await fingerprint(["parts"])).toBe(before);
    const done = await csvPost(counter, `\uFEFF${csv}`);
    expect(done.json).toMatchObject({ added: 2, updated: 0 });
    // The preview of the second file says what it will do: the pump's price changes, the hose is
    // as stored.
    const second = csv.replace("249.50", "259.00");
    const dry2 = await csvPost(counter, second, true);
    expect(dry2.json.preview.map((p: { action: string }) => p.action)).toEqual([
      "update",
      "unchanged",
    ]);
    const again = await csvPost(counter, second);
    // Only the pump's price changed: the hose, equal to what is stored, is not written again.
    expect(again.json).toMatchObject({ added: 0, updated: 1, unchanged: 1 });
    const [p] =
      await sql`select price_minor, specs from parts where shop_id = 'demo-shop-ridgeback' and sku = ${`${tag}-P`}`;
    expect(p!.price_minor).toBe(25900);
    expect(p!.specs.curves[0].points[1]).toEqual({ pressureKpa: 500, flowLPerH: 340 });
    const exp = await request(counter, "GET", "/api/v1/parts/export");
    expect(exp.headers.get("content-type")).toContain("text/csv");
    expect(exp.text).toContain(`${tag}-P,pump,Testbrand,Good pump,259.00`);
    expect(exp.text).toContain("13.5V 300:400 500:340 700:270");
  });

  it("refuses empty, binary and oversized files and the wrong content type", async () => {
    const before = await fingerprint(["parts"]);
    expect((await csvPost(counter, "")).status).toBe(400);
    expect((await csvPost(counter, "sku,category\u0000\u0001")).status).toBe(415);
    expect(
      (await request(counter, "POST", "/api/v1/parts/import", "x", { "content-type": "image/png" }))
        .status,
    ).toBe(415);
    expect((await csvPost(counter, `${HEADER}\n${"x,".repeat(1_100_000)}`)).status).toBe(413);
    expect((await csvPost(counter, "sku,brand\nA,B")).json.error.rows[0]).toMatchObject({
      line: 1,
      field: "header",
    });
    expect(await fingerprint(["parts"])).toBe(before);
  });

  it("roles: the tuner reads but cannot change the catalog; another shop sees none of it", async () => {
    expect((await request(tuner, "GET", "/api/v1/parts")).status).toBe(200);
    expect((await csvPost(tuner, HEADER)).status).toBe(403);
    expect((await request(customer, "GET", "/api/v1/parts")).status).toBe(403);
    const mine = (await request(counter, "GET", `/api/v1/parts?q=${tag}`)).json.parts;
    expect(mine.length).toBeGreaterThan(0);
    expect((await request(outsider, "GET", `/api/v1/parts?q=${tag}`)).json.parts).toEqual([]);
    expect((await request(outsider, "GET", `/api/v1/parts/${mine[0].id}`)).status).toBe(404);
    expect((await request(outsider, "DELETE", `/api/v1/parts/${mine[0].id}`)).status).toBe(404);
  });
});

describe("quotes", () => {
  const customerId = "00000000-0000-4000-8000-000000000001"; // the portal customer (db/seed.ts)

  it("numbers have no gaps or duplicates under 20 concurrent creations", async () => {
    const made = await Promise.all(
      Array.from({ length: 20 }, () => request(counter, "POST", "/api/v1/quotes", { customerId })),
    );
    expect(made.map((r) => r.status)).toEqual(Array(20).fill(201));
    const numbers = made.map((r) => r.json.quote.number as number).sort((a, b) => a - b);
    expect(new Set(numbers).size).toBe(20);
    expect(numbers[19]! - numbers[0]!).toBe(19);
    const [{ max }] =
      // Quotes other suites write straight into the table take numbers from 900 000 up.
      (await sql`select max(number)::int as max from quotes where shop_id = 'demo-shop-ridgeback' and number < 900000`) as unknown as [
        { max: number },
      ];
    expect(max).toBe(numbers[19]);
  });

  it("holds stock when accepted and releases it when declined; editing locks once accepted", async () => {
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, specs) values ('demo-shop-ridgeback', ${`${tag}-RES`}, 'other', 'Testbrand', 'Reservable', 1000, 5, '{}') returning id`;
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId })).json.quote;
    const lines = [
      {
        kind: "part",
        partId: part!.id,
        description: "Reservable",
        quantityMilli: 2000,
        unitPriceMinor: 1000,
        discountBp: 0,
      },
    ];
    const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-01-01",
      lines,
    });
    expect(saved.status).toBe(200);
    // By hand: 2 × 10.00 = 20.00; 8.25 % tax = 1.65; total 21.65.
    expect(saved.json.quote).toMatchObject({
      subtotalMinor: 2000,
      taxMinor: 165,
      totalMinor: 2165,
    });
    const reserved = async () =>
      (await sql`select reserved from parts where id = ${part!.id}`)[0]!.reserved as number;
    expect(
      (await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, { status: "accepted" }))
        .status,
    ).toBe(422); // draft → accepted skips "sent"
    await sql`update quotes set status = 'sent' where id = ${q.id}`;
    expect(
      (await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, { status: "accepted" }))
        .status,
    ).toBe(200);
    expect(await reserved()).toBe(2);
    const locked = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: saved.json.quote.version + 1, // the version it has now: the state refuses, not the version
      validUntil: "2099-01-01",
      lines: [],
    });
    expect(locked.status).toBe(422);
    expect(locked.json.error.code).toBe("invalid_transition");
    expect(await reserved()).toBe(2);
    expect(
      (await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, { status: "declined" }))
        .status,
    ).toBe(200);
    expect(await reserved()).toBe(0);
  });

  it("a revision of an accepted quote keeps its number and moves the held stock", async () => {
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, specs) values ('demo-shop-ridgeback', ${`${tag}-REV`}, 'other', 'Testbrand', 'Revisable', 500, 9, '{}') returning id`;
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId })).json.quote;
    await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-01-01",
      lines: [
        {
          kind: "part",
          partId: part!.id,
          description: "R",
          quantityMilli: 3000,
          unitPriceMinor: 500,
          discountBp: 0,
        },
      ],
    });
    await sql`update quotes set status = 'sent' where id = ${q.id}`;
    await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, { status: "accepted" });
    const rev = await request(counter, "POST", `/api/v1/quotes/${q.id}/revise`);
    expect(rev.status).toBe(201);
    expect(rev.json.quote).toMatchObject({ number: q.number, revision: 2, status: "draft" });
    expect((await sql`select reserved from parts where id = ${part!.id}`)[0]!.reserved).toBe(0);
    expect((await sql`select status from quotes where id = ${q.id}`)[0]!.status).toBe("superseded");
  });

  it("bad lines get field errors and write nothing", async () => {
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId })).json.quote;
    const before = await fingerprint(["quotes", "quote_lines"]);
    const r = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "soon",
      lines: [
        {
          kind: "part",
          description: "",
          quantityMilli: -1,
          unitPriceMinor: 1.5,
          discountBp: 20000,
        },
      ],
    });
    expect(r.status).toBe(422);
    const paths = r.json.error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        "validUntil",
        "lines.0.description",
        "lines.0.quantityMilli",
        "lines.0.unitPriceMinor",
        "lines.0.discountBp",
      ]),
    );
    expect(await fingerprint(["quotes", "quote_lines"])).toBe(before);
  });

  it("sending e-mails the customer with a portal link and logs it; the customer sees only their own quotes", async () => {
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId })).json.quote;
    expect((await request(counter, "POST", `/api/v1/quotes/${q.id}/send`)).status).toBe(422); // no lines yet
    await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-01-01",
      lines: [
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1500,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
      ],
    });
    const sent = await request(counter, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);
    const mail = await waitForMail(
      "customer@demo.fuelwright.test",
      new RegExp(`Q-${String(q.number).padStart(4, "0")}`),
    );
    expect(mail.text).toContain(`/my/quotes/${q.id}`);
    expect(mail.text).toContain("$194.85"); // 1.5 h × 120.00 = 180.00 + 8.25 % = 194.85 (by hand)
    const got = await request(customer, "GET", `/api/v1/quotes/${q.id}`);
    expect(got.status).toBe(200);
    expect(got.json.quote.status).toBe("sent");
    expect(got.json.messages).toHaveLength(1);
    const list = await request(customer, "GET", "/api/v1/quotes");
    const ids = list.json.quotes.map((x: { id: string }) => x.id);
    expect(ids).toContain(q.id);
    const [{ n }] =
      (await sql`select count(*)::int as n from quotes q join customers c on c.id = q.customer_id where c.user_id = 'demo-user-customer' and q.status <> 'draft'`) as unknown as [
        { n: number },
      ];
    expect(ids).toHaveLength(n);
    // Another customer's quote is "not found" to this customer, and any quote to another shop.
    const [othersQuote] =
      await sql`select q.id from quotes q join customers c on c.id = q.customer_id where c.user_id is null limit 1`;
    expect((await request(customer, "GET", `/api/v1/quotes/${othersQuote!.id}`)).status).toBe(404);
    expect(
      (await request(customer, "POST", `/api/v1/quotes/${q.id}/status`, { status: "accepted" }))
        .status,
    ).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/quotes/${q.id}`)).status).toBe(404);
    expect((await request(outsider, "POST", `/api/v1/quotes/${q.id}/send`)).status).toBe(404);
    expect((await request(tuner, "POST", "/api/v1/quotes", { customerId })).status).toBe(403);
  });
});

describe("customer decisions", () => {
  it("the customer accepts their own sent quote once; the decision records who and when", async () => {
    const customerId = "00000000-0000-4000-8000-000000000001";
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId })).json.quote;
    expect(
      (await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, { decision: "accept" }))
        .status,
    ).toBe(404); // a draft is not shown to the customer at all
    await sql`update quotes set status = 'sent' where id = ${q.id}`;
    expect(
      (await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, { decision: "maybe" }))
        .status,
    ).toBe(422);
    expect(
      (await request(counter, "POST", `/api/v1/quotes/${q.id}/respond`, { decision: "accept" }))
        .status,
    ).toBe(403);
    const ok = await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
      decision: "accept",
    });
    expect(ok.status).toBe(200);
    expect(ok.json.quote).toMatchObject({
      status: "accepted",
      statusChangedBy: "demo-user-customer",
    });
    expect(ok.json.quote.statusChangedAt).toBeTruthy();
    expect(
      (await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, { decision: "decline" }))
        .status,
    ).toBe(409);
    const [other] =
      await sql`select q.id from quotes q join customers c on c.id = q.customer_id where c.user_id is null and q.status = 'sent' limit 1`;
    expect(other).toBeTruthy(); // demo quote 2 is sent to a customer without a sign-in (db/seed.ts)
    expect(
      (
        await request(customer, "POST", `/api/v1/quotes/${other!.id}/respond`, {
          decision: "accept",
        })
      ).status,
    ).toBe(404);
  });
});

describe("kit recommendation on a build", () => {
  it("ranks demo parts for a demo build, and choosing writes a revision sized with the parts' data", async () => {
    const buildId = "10000000-0000-4000-8000-000000000002"; // turbo six on E85 (db/seed.ts)
    const kit = await request(counter, "GET", `/api/v1/builds/${buildId}/kit`);
    expect(kit.status).toBe(200);
    const inj = kit.json.roles.find((r: { role: string }) => r.role === "injector").candidates;
    expect(inj.length).toBeGreaterThan(3);
    const best = inj[0];
    expect(best.fits).toBe(true);
    const pump = kit.json.roles
      .find((r: { role: string }) => r.role === "pump")
      .candidates.find((c: { fits: boolean }) => c.fits);
    const before = await fingerprint(["builds", "build_revisions"]);
    expect(
      // A well-formed choice: the refusal is the role's (the command checks it after parsing).
      (
        await request(customer, "POST", `/api/v1/builds/${buildId}/kit`, {
          version: kit.json.buildVersion,
          parts: [{ role: "injector", partId: best.part.id, quantity: best.quantity }],
        })
      ).status,
    ).toBe(403);
    expect(
      (
        await request(counter, "POST", `/api/v1/builds/${buildId}/kit`, {
          version: kit.json.buildVersion,
          parts: [{ role: "pump", partId: best.part.id, quantity: 1 }],
        })
      ).status,
    ).toBe(422);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
    // The tuner's choice re-sizes the build (a counter's goes on the quote only: kit-commands).
    const chose = await request(tuner, "POST", `/api/v1/builds/${buildId}/kit`, {
      version: kit.json.buildVersion,
      parts: [
        { role: "injector", partId: best.part.id, quantity: best.quantity },
        { role: "pump", partId: pump.part.id, quantity: pump.quantity },
      ],
    });
    expect(chose.status).toBe(200);
    expect(chose.json.build.version).toBe(kit.json.buildVersion + 1);
    expect(chose.json.build.inputs.injectors.ratedFlowCcPerMin).toBe(
      best.part.specs.ratedFlowCcPerMin,
    );
    expect(chose.json.build.result.injector.dutyPct).toBeCloseTo(best.figure, 6);
    expect(chose.json.build.parts.map((p: { role: string }) => p.role)).toEqual([
      "injector",
      "pump",
    ]);
    const [rev] =
      await sql`select parts from build_revisions where build_id = ${buildId} and version = ${chose.json.build.version}`;
    expect(rev!.parts).toHaveLength(2);
    const stale = await request(counter, "POST", `/api/v1/builds/${buildId}/kit`, {
      version: kit.json.buildVersion,
      parts: [{ role: "injector", partId: best.part.id, quantity: 6 }],
    });
    expect(stale.status).toBe(409);
    const quote = await request(counter, "POST", "/api/v1/quotes", { buildId });
    expect(quote.status).toBe(201);
    const full = await request(counter, "GET", `/api/v1/quotes/${quote.json.quote.id}`);
    expect(full.json.lines.map((l: { kind: string }) => l.kind)).toEqual([
      "part",
      "part",
      "labour",
    ]);
  });
});
