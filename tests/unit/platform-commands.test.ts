import { beforeEach, describe, expect, it, vi } from "vitest";

import type { Member } from "@/lib/auth/member";
import { Forbidden, Invalid, Unavailable } from "@/lib/domain/errors";
import type { Role } from "@/lib/domain/roles";

/**
 * The platform's commands check the member's role before any query runs, so a refused call
 * cannot have changed anything; the queries are stand-ins here that record each call.
 */
const q = vi.hoisted(() => ({
  updateShopSettings: vi.fn(),
  getShopSettings: vi.fn(),
  setLogo: vi.fn(),
  deleteLogo: vi.fn(),
  isMemberByEmail: vi.fn(),
  hasOpenInvitation: vi.fn(),
  insertInvitation: vi.fn(),
  setMemberRole: vi.fn(),
  removeMember: vi.fn(),
  insertShareLink: vi.fn(),
  markShareLinkRevoked: vi.fn(),
  setUnitSystem: vi.fn(),
  sendMail: vi.fn(),
}));
vi.mock("@/db/queries/shops", () => ({
  updateShopSettings: q.updateShopSettings,
  getShopSettings: q.getShopSettings,
}));
vi.mock("@/db/queries/logos", () => ({ setLogo: q.setLogo, deleteLogo: q.deleteLogo }));
vi.mock("@/db/queries/members", () => ({
  isMemberByEmail: q.isMemberByEmail,
  hasOpenInvitation: q.hasOpenInvitation,
  insertInvitation: q.insertInvitation,
  setMemberRole: q.setMemberRole,
  removeMember: q.removeMember,
}));
vi.mock("@/db/queries/shares", () => ({
  insertShareLink: q.insertShareLink,
  markShareLinkRevoked: q.markShareLinkRevoked,
}));
vi.mock("@/db/queries/preferences", () => ({ setUnitSystem: q.setUnitSystem }));
vi.mock("@/lib/mail", () => ({ sendMail: q.sendMail }));
vi.mock("@/lib/env", () => ({ serverEnv: () => ({ APP_URL: "https://shop.example.test" }) }));

const { changeMemberRole, inviteMember, removeMember } =
  await import("@/lib/members/member-commands");
const { removeShopLogo, saveShopSettings, setShopLogo } = await import("@/lib/shop/shop-commands");
const { createShareLink, revokeShareLink } = await import("@/lib/shares/share-commands");
const { setUnits } = await import("@/lib/preferences/preference-commands");

const as = (role: Role): Member => ({
  user: { id: `user-${role}`, name: `The ${role}`, email: `${role}@shop.example.test` },
  shopId: "shop-1",
  shopName: "Test Shop",
  role,
});

const SETTINGS = {
  shopName: "Test Shop",
  currency: "EUR",
  taxRatePct: 19,
  units: "metric" as const,
  address: "",
  phone: undefined,
  bsfcGasolineNa: 304,
  bsfcGasolineBoosted: 365,
  bsfcE85Na: 426,
  bsfcE85Boosted: 487,
  designDutyPct: 80,
  dutyCautionPct: 80,
  dutyDangerPct: 90,
  minPumpMarginPct: 25,
  maxLineDropKpa: 14,
  lossManualPct: 12,
  lossAutomaticPct: 17,
  lossAwdPct: 22,
  labourRate: 120.5,
  depositPct: 30,
  quoteValidDays: 30,
};
const BUILD = "10000000-0000-4000-8000-000000000003";
const LINK = "20000000-0000-4000-8000-000000000001";
const logo = {
  bytes: Buffer.from("png"),
  info: { contentType: "image/png" as const, width: 64, height: 64 },
};

beforeEach(() => {
  for (const f of Object.values(q)) f.mockReset();
});

const noQueryRan = () => {
  for (const [name, f] of Object.entries(q)) expect(f, name).not.toHaveBeenCalled();
};

describe("owner-only commands", () => {
  const ownerOnly: [string, (m: Member) => Promise<unknown>][] = [
    ["save settings", (m) => saveShopSettings(m, SETTINGS)],
    ["set the logo", (m) => setShopLogo(m, logo)],
    ["remove the logo", (m) => removeShopLogo(m)],
    ["invite", (m) => inviteMember(m, { email: "new@example.test", role: "tuner" })],
    ["change a role", (m) => changeMemberRole(m, { memberId: "m-1", role: "owner" })],
    ["remove a member", (m) => removeMember(m, { memberId: "m-1" })],
  ];
  for (const role of ["tuner", "counter", "customer"] as const)
    it.each(ownerOnly)(`refuse a ${role} (%s) before any query`, async (_, run) => {
      await expect(run(as(role))).rejects.toBeInstanceOf(Forbidden);
      noQueryRan();
    });
});

describe("share links and units", () => {
  it("a customer makes, withdraws and sets nothing", async () => {
    const c = as("customer");
    await expect(createShareLink(c, { buildId: BUILD, days: 7 })).rejects.toBeInstanceOf(Forbidden);
    await expect(revokeShareLink(c, { id: LINK })).rejects.toBeInstanceOf(Forbidden);
    await expect(setUnits(c, { units: "metric" })).rejects.toBeInstanceOf(Forbidden);
    noQueryRan();
  });

  it("staff make a link in their own shop; the result is plain data with the URL", async () => {
    q.insertShareLink.mockResolvedValue({
      link: { id: LINK, expiresAt: new Date("2030-01-08T00:00:00Z") },
      token: "abc.def",
    });
    const made = await createShareLink(as("counter"), { buildId: BUILD, days: 7 });
    expect(q.insertShareLink).toHaveBeenCalledWith("shop-1", BUILD, "user-counter", 7);
    expect(made).toEqual({
      link: { id: LINK, expiresAt: "2030-01-08T00:00:00.000Z" },
      url: "https://shop.example.test/share/abc.def",
    });
  });
});

/** The stored row the command reads before and after its write (db/schema/shops.ts defaults). */
const STORED = {
  name: "Test Shop",
  settings: {
    ...SETTINGS,
    shopId: "shop-1",
    taxRateBp: 1900,
    labourRateMinor: 12050,
    depositBp: 3000,
    address: null,
    phone: null,
    gasolineDensityKgPerL: null,
    gasolineStoichAfr: null,
    ethanolDensityKgPerL: null,
    ethanolStoichAfr: null,
    paperSize: "a4",
    timeZone: "Europe/Berlin",
    updatedAt: new Date("2026-12-01T00:00:00Z"),
  },
};

describe("settings", () => {
  beforeEach(() => q.getShopSettings.mockResolvedValue(STORED));

  it("the owner's save keeps money and rates as integers and leaves an unsent phone alone", async () => {
    await saveShopSettings(as("owner"), SETTINGS);
    const [shopId, name, values] = q.updateShopSettings.mock.calls[0]!;
    expect([shopId, name]).toEqual(["shop-1", "Test Shop"]);
    // 19 % = 1900 basis points; 120.50 an hour = 12050 minor units; 30 % = 3000 bp.
    expect(values).toMatchObject({ taxRateBp: 1900, labourRateMinor: 12050, depositBp: 3000 });
    expect(values).toMatchObject({ address: null });
    expect(values).not.toHaveProperty("phone");
    expect(values).not.toHaveProperty("taxRatePct");
  });

  it("a change of some settings writes only those; a caution level above the stored danger level is refused", async () => {
    await saveShopSettings(as("owner"), { designDutyPct: 75, timeZone: "America/Chicago" });
    const [, name, values] = q.updateShopSettings.mock.calls[0]!;
    expect(name).toBeUndefined();
    expect(values).toEqual({ designDutyPct: 75, timeZone: "America/Chicago" });
    const err = await saveShopSettings(as("owner"), { dutyCautionPct: 95 }).catch((e) => e);
    expect(err).toBeInstanceOf(Invalid);
    expect((err as Invalid).issues).toEqual([
      {
        path: "dutyCautionPct",
        message: "Caution above (95 %) must not be higher than Danger above (90 %)",
      },
    ]);
    expect(q.updateShopSettings).toHaveBeenCalledTimes(1);
  });
});

describe("invitations", () => {
  const input = { email: "new@example.test", role: "counter" as const };

  it("e-mail the link first and record the invitation after", async () => {
    q.isMemberByEmail.mockResolvedValue(false);
    q.hasOpenInvitation.mockResolvedValue(false);
    const out = await inviteMember(as("owner"), input);
    const mail = q.sendMail.mock.calls[0]![0] as { to: string; text: string; subject: string };
    const row = q.insertInvitation.mock.calls[0]![1] as { id: string; role: string };
    expect(mail.to).toBe("new@example.test");
    expect(mail.subject).toBe("Test Shop invites you to Fuelwright");
    expect(mail.text).toContain(`https://shop.example.test/accept-invitation/${row.id}`);
    expect(mail.text).toContain("as Counter");
    expect(row.role).toBe("counter");
    expect(q.sendMail.mock.invocationCallOrder[0]).toBeLessThan(
      q.insertInvitation.mock.invocationCallOrder[0]!,
    );
    // Valid for 7 days (INVITATION_DAYS, as better-auth's own invitations).
    expect(Math.abs(Date.parse(out.expiresAt) - Date.now() - 7 * 86_400_000)).toBeLessThan(5000);
  });

  it("record nothing when the mail server refuses", async () => {
    q.isMemberByEmail.mockResolvedValue(false);
    q.hasOpenInvitation.mockResolvedValue(false);
    q.sendMail.mockRejectedValue(new Error("550 mailbox unavailable"));
    vi.spyOn(console, "error").mockImplementation(() => {});
    await expect(inviteMember(as("owner"), input)).rejects.toBeInstanceOf(Unavailable);
    expect(q.insertInvitation).not.toHaveBeenCalled();
  });

  it("refuse a member or a pending invitation as an e-mail field error, sending nothing", async () => {
    q.isMemberByEmail.mockResolvedValue(true);
    const member = await inviteMember(as("owner"), input).catch((e: unknown) => e);
    expect(member).toBeInstanceOf(Invalid);
    expect(member).toMatchObject({ code: "already_member", issues: [{ path: "email" }] });
    q.isMemberByEmail.mockResolvedValue(false);
    q.hasOpenInvitation.mockResolvedValue(true);
    await expect(inviteMember(as("owner"), input)).rejects.toMatchObject({
      code: "already_invited",
    });
    expect(q.sendMail).not.toHaveBeenCalled();
    expect(q.insertInvitation).not.toHaveBeenCalled();
  });
});
