import { createRequire } from "node:module";

import { describe, expect, it } from "vitest";

import { actionRequestRefusal, undecodablePath } from "@/lib/http/action-request";
import { controlCharacterIssues } from "@/lib/http/text";

const require = createRequire(import.meta.url);
// React's own encoder for server-action arguments (what our pages send).
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.edge") as {
  encodeReply: (v: unknown) => Promise<string | FormData>;
};

const ID = "7f8442debab01b6527679d57edca203797c4628855";
const call = (body: BodyInit, type?: string, headers: Record<string, string> = {}) =>
  new Request("http://localhost:3000/customers", {
    method: "POST",
    headers: { "next-action": ID, ...(type ? { "content-type": type } : {}), ...headers },
    body,
  });
const multipart = (parts: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(parts)) f.set(k, v);
  return f;
};

describe("addresses", () => {
  it("a broken % escape is found in any segment; valid escapes and plain paths pass", () => {
    for (const bad of ["/builds/%E0%A4%A", "/api/v1/builds/%zz", "/%", "/quotes/%C3%28"])
      expect(undecodablePath(bad), bad).toBe(true);
    for (const good of ["/builds/%E0%A4%A4", "/api/v1/builds/%20x", "/customers", "/"])
      expect(undecodablePath(good), good).toBe(false);
  });
});

describe("server action requests", () => {
  it("what React's encoder sends passes: plain values, dates, form data, shared objects", async () => {
    const shared = { a: 1 };
    const form = new FormData();
    form.set("name", "Ada");
    for (const [i, args] of [
      [{ ok: false }, { id: "x", n: 1.5, d: new Date(0), big: 12n, none: undefined }],
      [{ ok: false }, form],
      [{ ok: false }, { one: shared, two: shared, m: new Map([[1, 2]]), s: new Set([1]) }],
      ["00000000-0000-4000-8000-00000000abcd"],
    ].entries()) {
      const body = await encodeReply(args);
      const req =
        typeof body === "string" ? call(body, "text/plain;charset=UTF-8") : call(body as FormData);
      expect(await actionRequestRefusal(req), `arguments ${i}`).toBeNull();
    }
  });

  it("bad JSON, a garbled or boundless multipart body and a body of another type are refused", async () => {
    const cases: [Request, number][] = [
      [call('[{"ok":false},{"id":', "text/plain;charset=UTF-8"), 400],
      [call("{}", "text/plain"), 400], // not a list of arguments
      [call('{"id":"x"}', "application/json"), 415],
      [call("id=x", "application/x-www-form-urlencoded"), 415],
      [
        call(
          '--XYZ\r\nContent-Disposition: form-data; name="0"\r\n\r\n[]\r\n--XY',
          "multipart/form-data; boundary=XYZ",
        ),
        400,
      ],
      [call("hello", "multipart/form-data"), 400],
      [call(multipart({ "0": "[{" })), 400],
      [call(multipart({ "1": "[]" })), 400], // no root part
    ];
    for (const [req, status] of cases) {
      const r = await actionRequestRefusal(req);
      expect(r?.status, req.headers.get("content-type") ?? "").toBe(status);
      expect(r?.message.length).toBeGreaterThan(10);
    }
  });

  it("references to parts that are not there, and kinds of value our pages never send, are refused", async () => {
    for (const ref of ["$@5", "$Q5", "$5", "$5:a", "$", "$h1", "$B1", "$nabc", "$R1", "$A1"]) {
      const r = await actionRequestRefusal(
        call(JSON.stringify([{ ok: false }, ref]), "text/plain;charset=UTF-8"),
      );
      expect(r?.status, ref).toBe(400);
    }
    // A map part that is no list of pairs, a path through null.
    expect(
      (await actionRequestRefusal(call(multipart({ "0": '["$Q1"]', "1": "1" }))))?.status,
    ).toBe(400);
    expect(
      (await actionRequestRefusal(call(multipart({ "0": '["$1:a:b"]', "1": '{"a":null}' }))))
        ?.status,
    ).toBe(400);
    // Escaped dollars and plain markers are values.
    expect(
      await actionRequestRefusal(
        call('[{"ok":false},["$$x","$undefined","$D2024-01-01","$n12","$K1","$T"]]', "text/plain"),
      ),
    ).toBeNull();
  });

  it("a form posted without scripts must be readable; a plain POST to a page is left alone", async () => {
    const form = multipart({ [`$ACTION_ID_${ID}`]: "", name: "x" });
    const noScript = (body: BodyInit, type?: string) =>
      new Request("http://localhost:3000/customers", {
        method: "POST",
        headers: type ? { "content-type": type } : {},
        body,
      });
    expect(await actionRequestRefusal(noScript(form))).toBeNull();
    expect(
      (await actionRequestRefusal(noScript(multipart({ $ACTION_REF_1: "", "$ACTION_1:0": "{" }))))
        ?.status,
    ).toBe(400);
    expect(
      (await actionRequestRefusal(noScript("--B\r\nbroken", "multipart/form-data; boundary=B")))
        ?.status,
    ).toBe(400);
    expect(await actionRequestRefusal(noScript("a=b", "application/x-www-form-urlencoded"))).toBe(
      null,
    );
  });

  it("the control-character check survives arguments that refer to themselves", () => {
    const loop: Record<string, unknown> = { name: "a\u0000" };
    loop.self = loop;
    expect(controlCharacterIssues(loop).map((i) => i.path)).toEqual(["name"]);
  });
});
