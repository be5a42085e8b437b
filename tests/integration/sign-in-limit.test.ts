import { describe, expect, it } from "vitest";

import { BASE_URL, nextIp } from "../helpers/http";

describe("sign-in rate limit", () => {
  it("refuses the fourth sign-in from one address within ten seconds", async () => {
    const ip = nextIp();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await fetch(`${BASE_URL}/api/auth/sign-in/email`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": ip },
        body: JSON.stringify({
          email: "owner@demo.fuelwright.test",
          password: "wrong-password-123",
        }),
      });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 3), statuses.join()).toEqual([401, 401, 401]);
    expect(statuses[3]).toBe(429);
  });
});
