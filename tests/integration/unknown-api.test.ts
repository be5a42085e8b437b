import { describe, expect, it } from "vitest";

import { BASE_URL } from "../helpers/http";

// A client that mistypes an address gets JSON it can read, like every other API answer.
describe("an /api address no route answers", () => {
  it("answers 404 with JSON naming the address, for every method, signed in or not", async () => {
    for (const method of ["GET", "POST", "PATCH", "DELETE"]) {
      const r = await fetch(`${BASE_URL}/api/v1/bulids/x?y=1`, {
        method,
        headers: { origin: BASE_URL, "content-type": "application/json" },
        body: method === "GET" ? undefined : "{}",
      });
      expect(r.status, method).toBe(404);
      expect(r.headers.get("content-type")).toContain("application/json");
      const body = (await r.json()) as { error: { code: string; message: string } };
      expect(body.error).toMatchObject({ code: "unknown_route" });
      expect(body.error.message).toContain("/api/v1/bulids/x");
    }
  });

  it("leaves the routes that exist alone (health answers; the builds list still asks for a sign-in)", async () => {
    expect((await fetch(`${BASE_URL}/api/health`)).status).toBe(200);
    const r = await fetch(`${BASE_URL}/api/v1/builds`);
    expect(r.status).toBe(401);
  });
});
