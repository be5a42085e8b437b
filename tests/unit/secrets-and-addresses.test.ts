import { describe, expect, it } from "vitest";

import { productionProblems, secretProblem, type ServerEnv } from "@/lib/env";
import { clientAddressOf, normalizeAddress } from "@/lib/http/client-address";

const random = "3f9c1e0a7b2d4c6e8f1a3b5c7d9e0f2a4b6c8d0e1f3a5b7c9d1e3f5a7b9c1d3e";
const env = (over: Partial<ServerEnv>) =>
  ({
    NODE_ENV: "production",
    BETTER_AUTH_SECRET: random,
    STRIPE_WEBHOOK_SECRET: `whsec_${random}`,
    ...over,
  }) as ServerEnv;

describe("secrets in production", () => {
  it("a generated secret will do", () => {
    expect(secretProblem("X", random)).toBeNull();
    expect(productionProblems(env({}))).toEqual([]);
  });
  it("defaults and placeholders known from this repository are refused", () => {
    for (const v of [
      "whsec_fuelwright_local_fake",
      "whsec_fuelwright_test_secret",
      "test-secret-test-secret-test-secret-0123",
      "build-time-placeholder-never-served-0000",
    ])
      expect(secretProblem("X", v)).toMatch(/default or placeholder/);
    expect(
      productionProblems(env({ STRIPE_WEBHOOK_SECRET: "whsec_fuelwright_local_fake" })),
    ).toEqual([expect.stringMatching(/^STRIPE_WEBHOOK_SECRET is a default/)]);
  });
  it("short or uniform secrets are refused", () => {
    expect(secretProblem("X", "whsec_short")).toMatch(/at least 32/);
    expect(secretProblem("X", "a".repeat(64))).toMatch(/too uniform/);
    expect(secretProblem("X", "ab".repeat(32))).toMatch(/too uniform/);
  });
  it("outside production the development defaults are allowed", () => {
    expect(
      productionProblems(
        env({ NODE_ENV: "development", STRIPE_WEBHOOK_SECRET: "whsec_fuelwright_local_fake" }),
      ),
    ).toEqual([]);
  });
});

describe("the client's address", () => {
  it("without a trusted proxy is the socket's peer, whatever forwarding headers say", () => {
    const h = { "x-forwarded-for": "203.0.113.9", "x-real-ip": "203.0.113.10" };
    expect(clientAddressOf("10.1.2.3", h, "")).toBe("10.1.2.3");
    expect(clientAddressOf("::ffff:127.0.0.1", h, "")).toBe("127.0.0.1");
    expect(clientAddressOf("2001:DB8::1", {}, "")).toBe("2001:db8::1");
    expect(clientAddressOf(undefined, h, "")).toBe("unknown");
  });
  it("behind a trusted proxy is the last address in its header: what a client put first is not believed", () => {
    expect(
      clientAddressOf("10.0.0.5", { "x-forwarded-for": "203.0.113.9" }, "x-forwarded-for"),
    ).toBe("203.0.113.9");
    expect(
      clientAddressOf(
        "10.0.0.5",
        { "x-forwarded-for": "1.1.1.1, 2.2.2.2, 203.0.113.9" },
        "x-forwarded-for",
      ),
    ).toBe("203.0.113.9");
    expect(clientAddressOf("10.0.0.5", { "x-real-ip": "203.0.113.7" }, "x-real-ip")).toBe(
      "203.0.113.7",
    );
    // Missing or not an address: the peer.
    expect(clientAddressOf("10.0.0.5", {}, "x-forwarded-for")).toBe("10.0.0.5");
    expect(clientAddressOf("10.0.0.5", { "x-forwarded-for": "evil" }, "x-forwarded-for")).toBe(
      "10.0.0.5",
    );
  });
  it("normalizes the forms an address comes in", () => {
    expect(normalizeAddress("[::1]")).toBe("::1");
    expect(normalizeAddress(" 192.0.2.1 ")).toBe("192.0.2.1");
    expect(normalizeAddress("::FFFF:192.0.2.1")).toBe("192.0.2.1");
    expect(normalizeAddress("192.0.2.1:443")).toBeNull();
  });
});
