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
    expect(crossSiteRefusal(req("DELETE", { "sec-fetch-site": "same-origin" }))).toBeNull();
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
