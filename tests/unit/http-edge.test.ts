import { beforeAll, describe, expect, it } from "vitest";

import { readJson } from "@/lib/http/body";
import { describeError } from "@/lib/http/error-map";
import { handle } from "@/lib/http/handler";
import { crossSiteRefusal } from "@/lib/http/same-origin";
import { controlCharacterIssues } from "@/lib/http/text";

beforeAll(() => {
  process.env.DATABASE_URL ??= "postgres://x@127.0.0.1:1/x";
  process.env.BETTER_AUTH_SECRET ??= "unit-secret-unit-secret-unit-secret-0123";
  process.env.APP_URL = "http://localhost:3000";
});

const req = (
  method: string,
  headers: Record<string, string> = {},
  body?: string,
  path = "/api/v1/customers",
) => new Request(`http://localhost:3000${path}`, { method, headers, body });

describe("cross-site writes", () => {
  it("lets reads through whatever their origin", () => {
    expect(crossSiteRefusal(req("GET", { origin: "https://evil.example" }))).toBeNull();
  });
  it("lets our own origins write", () => {
    for (const origin of ["http://localhost:3000", "http://127.0.0.1:3000"])
      expect(crossSiteRefusal(req("POST", { origin }))).toBeNull();
    expect(
      crossSiteRefusal(
        req("DELETE", { origin: "http://localhost:3000", "sec-fetch-site": "same-origin" }),
      ),
    ).toBeNull();
  });
  it("refuses another site, a null origin from another site, and a write naming no origin", () => {
    expect(crossSiteRefusal(req("POST", { origin: "https://evil.example" }))).toMatch(
      /another site/,
    );
    expect(crossSiteRefusal(req("PATCH", { origin: "http://localhost:3001" }))).toMatch(
      /another site/,
    );
    expect(crossSiteRefusal(req("PUT", { "sec-fetch-site": "cross-site" }))).toMatch(
      /another site/,
    );
    expect(
      crossSiteRefusal(req("POST", { origin: "null", "sec-fetch-site": "cross-site" })),
    ).toMatch(/another site/);
    expect(crossSiteRefusal(req("POST"))).toMatch(/Origin/);
  });
  it("refuses Origin: null, a write naming no origin even when it says same-origin, and a mismatch", () => {
    expect(crossSiteRefusal(req("POST", { origin: "null" }))).toMatch(/no origin/);
    expect(
      crossSiteRefusal(req("POST", { origin: "null", "sec-fetch-site": "same-origin" })),
    ).toMatch(/no origin/);
    expect(crossSiteRefusal(req("DELETE", { "sec-fetch-site": "same-origin" }))).toMatch(/Origin/);
    expect(
      crossSiteRefusal(
        req("POST", { origin: "http://localhost:3000", "sec-fetch-site": "cross-site" }),
      ),
    ).toMatch(/another site/);
    expect(
      crossSiteRefusal(
        req("POST", { origin: "http://localhost:3000", "sec-fetch-site": "same-site" }),
      ),
    ).toMatch(/another site/);
  });
  it("a wrapped /api/v1 write from another site answers 403 and never runs", async () => {
    let ran = false;
    const route = handle(async () => {
      ran = true;
      return Response.json({ ok: true });
    });
    const res = await route(req("POST", { origin: "https://evil.example" }, "{}"), undefined);
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe("cross_site");
    expect(ran).toBe(false);
  });
});

describe("the type of a write's body", () => {
  const own = { origin: "http://localhost:3000" };
  const run = async (
    method: string,
    headers: Record<string, string>,
    body?: string,
    options?: Parameters<typeof handle>[1],
  ) => {
    let ran = false;
    const route = handle(async () => {
      ran = true;
      return new Response(null, { status: 204 });
    }, options);
    const res = await route(req(method, { ...own, ...headers }, body), undefined);
    return {
      status: res.status,
      ran,
      code: res.status === 204 ? null : (await res.json()).error.code,
    };
  };
  it("a JSON route refuses text/plain, urlencoded and multipart bodies with 415 before it runs", async () => {
    for (const type of [
      "text/plain;charset=UTF-8",
      "application/x-www-form-urlencoded",
      "multipart/form-data; boundary=x",
    ])
      expect(await run("POST", { "content-type": type }, '{"name":"x"}'), type).toEqual({
        status: 415,
        ran: false,
        code: "unsupported_type",
      });
  });
  it("a body naming no type is refused too; a write with no body at all runs", async () => {
    const res = await handle(async () => new Response(null, { status: 204 }))(
      new Request("http://localhost:3000/api/v1/customers", {
        method: "POST",
        headers: { ...own, "content-length": "2" },
        body: new Blob(["{}"]),
      }),
      undefined,
    );
    expect(res.status).toBe(415);
    expect(await run("DELETE", {})).toMatchObject({ status: 204, ran: true });
    expect(await run("POST", { "content-type": "application/json" })).toMatchObject({
      status: 204,
    });
  });
  it("a DELETE with a body that is not JSON is 415", async () => {
    expect(await run("DELETE", { "content-type": "text/plain" }, "x")).toMatchObject({
      status: 415,
      ran: false,
    });
  });
  it("an upload route takes its own types, and no other", async () => {
    const csv = { accepts: { types: ["text/csv"], message: "Send a CSV" } };
    expect(await run("POST", { "content-type": "text/csv" }, "a,b\n", csv)).toMatchObject({
      status: 204,
    });
    expect(await run("POST", { "content-type": "application/json" }, "{}", csv)).toMatchObject({
      status: 415,
      ran: false,
    });
  });
  it("another site is refused before the type is judged", async () => {
    expect(
      await run("POST", { origin: "https://evil.example", "content-type": "text/plain" }, "x"),
    ).toMatchObject({ status: 403, code: "cross_site" });
  });
});

describe("JSON bodies", () => {
  it("must be sent as JSON: a text/plain form post is refused with 415", async () => {
    const err = await readJson(req("POST", { "content-type": "text/plain" }, '{"name":"x"}')).catch(
      (e) => e,
    );
    expect(describeError(err)).toMatchObject({ status: 415, code: "not_json" });
  });
  it("accept application/json with parameters", async () => {
    const value = await readJson(
      req("POST", { "content-type": "application/json; charset=utf-8" }, '{"name":"Ada"}'),
    );
    expect(value).toEqual({ name: "Ada" });
  });
  it("refuse NUL and other control characters with the field's path (422)", async () => {
    const err = await readJson(
      req(
        "POST",
        { "content-type": "application/json" },
        '{"lines":[{"description":"a\\u0000b"}]}',
      ),
    ).catch((e) => e);
    const d = describeError(err);
    expect(d.status).toBe(422);
    expect(d.issues.map((i) => i.path)).toEqual(["lines.0.description"]);
  });
  it("keep tabs and line breaks, which people do type", () => {
    expect(controlCharacterIssues({ notes: "line one\r\nline\ttwo" })).toEqual([]);
    expect(controlCharacterIssues({ a: "\u0007", b: ["ok", "\u007f"] }).map((i) => i.path)).toEqual(
      ["a", "b.1"],
    );
  });
  it("refuse half a character (a lone surrogate), which jsonb cannot store; whole emoji pass", async () => {
    const err = await readJson(
      req("POST", { "content-type": "application/json" }, '{"title":"x\\ud800","notes":"😀"}'),
    ).catch((e) => e);
    const d = describeError(err);
    expect(d.status).toBe(422);
    expect(d.issues.map((i) => i.path)).toEqual(["title"]);
    expect(d.issues[0]!.message).toMatch(/half of a character/);
    expect(
      controlCharacterIssues({ a: "\udfffx", b: "𝕏😀", c: ["\ud83d"] }).map((i) => i.path),
    ).toEqual(["a", "c.0"]);
  });
  it("survive a body nested thousands of levels deep", () => {
    const deep = JSON.parse("[".repeat(20000) + '"\\u0000"' + "]".repeat(20000));
    expect(controlCharacterIssues(deep)).toHaveLength(1);
  });
  it("a NUL in a query parameter is a 422 naming the parameter", async () => {
    const route = handle(async () => Response.json({ ok: true }));
    const res = await route(req("GET", {}, undefined, "/api/v1/builds?q=a%00b"), undefined);
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues[0].path).toBe("q");
  });
});
