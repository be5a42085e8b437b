import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, formOf, type ActionRef } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { waitForMail } from "../helpers/mail";
import { SEED_SETTINGS_FORM } from "../helpers/surface";

/**
 * The settings page's writes (shop defaults, invitations, roles, removals) go through the
 * commands of lib/shop and lib/members: only the owner gets through, a refusal is a 403 in the
 * action's state and changes nothing, and the shop always keeps an owner.
 */

const DEMO_SHOP = "demo-shop-ridgeback";
const prev = { ok: false };
let owner: Client, tuner: Client, counter: Client, customer: Client;
let other: Awaited<ReturnType<typeof makeOtherShop>>, otherOwner: Client;

type State = {
  ok: boolean;
  status?: number;
  code?: string;
  message?: string;
  fieldErrors?: Record<string, string[]>;
};

function action(name: string) {
  const ref = actionManifest().find(
    (r) => r.file === "app/(shop)/settings/actions.ts" && r.name === name,
  );
  if (!ref) throw new Error(`${name} is not in the build's action manifest`);
  return async (who: Client, values: Record<string, string>) => {
    const r = await callAction(who, { ...ref, page: "/settings" } satisfies ActionRef, [
      prev,
      formOf(values),
    ]);
    expect(r.http, `${name}: answered`).toBeLessThan(500);
    return r.state as State;
  };
}
const updateSettings = action("updateSettingsAction");
const invite = action("inviteMemberAction");
const changeRole = action("changeRoleAction");
const remove = action("removeMemberAction");

beforeAll(async () => {
  other = await makeOtherShop();
  [owner, tuner, counter, customer, otherOwner] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

describe("shop settings", () => {
  it("only the owner saves them: a tuner, counter or customer gets 403 and nothing changes", async () => {
    const before = await fingerprint(["shop_settings", "organization"]);
    for (const who of [tuner, counter, customer]) {
      const s = await updateSettings(who, {
        ...SEED_SETTINGS_FORM,
        shopName: "Taken over",
        taxRatePct: "0",
      });
      expect(s).toMatchObject({ ok: false, status: 403, code: "forbidden" });
    }
    expect(await fingerprint(["shop_settings", "organization"])).toBe(before);
  });

  it("the owner saves them; an address or phone the form leaves out keeps its value", async () => {
    const withoutContact: Record<string, string> = { ...SEED_SETTINGS_FORM };
    delete withoutContact.address;
    delete withoutContact.phone;
    const saved = await updateSettings(otherOwner, {
      ...SEED_SETTINGS_FORM,
      shopName: "Other shop, renamed",
      address: "1 Test Road",
      phone: "555-0199",
      taxRatePct: "5.5",
      labourRate: "95.50",
    });
    expect(saved).toMatchObject({ ok: true, message: "Shop settings saved" });
    const read = async () =>
      (
        await sql`select o.name, s.address, s.phone, s.tax_rate_bp, s.labour_rate_minor
                  from shop_settings s join organization o on o.id = s.shop_id
                  where s.shop_id = ${other.shopId}`
      )[0];
    // 5.5 % = 550 basis points; 95.50 an hour = 9550 minor units.
    expect(await read()).toEqual({
      name: "Other shop, renamed",
      address: "1 Test Road",
      phone: "555-0199",
      tax_rate_bp: 550,
      labour_rate_minor: 9550,
    });
    expect((await updateSettings(otherOwner, { ...withoutContact, taxRatePct: "6" })).ok).toBe(
      true,
    );
    expect(await read()).toMatchObject({ address: "1 Test Road", phone: "555-0199" });
    expect((await updateSettings(otherOwner, { ...SEED_SETTINGS_FORM, address: "" })).ok).toBe(
      true,
    );
    expect((await read())!.address).toBeNull();
    // The demo shop was not touched by another shop's owner.
    const [demo] = await sql`select name from organization where id = ${DEMO_SHOP}`;
    expect(demo!.name).toBe("Ridgeback Fuel & Dyno");
  });

  it("a bad form names its fields and keeps what was typed", async () => {
    const s = await updateSettings(otherOwner, {
      ...SEED_SETTINGS_FORM,
      currency: "dollars",
      dutyCautionPct: "95",
      dutyDangerPct: "85",
    });
    expect(s).toMatchObject({ ok: false, status: 422 });
    // Both levels changed (no loaded levels sent): the caution level is marked, saying why.
    expect(Object.keys(s.fieldErrors ?? {})).toEqual(
      expect.arrayContaining(["currency", "dutyCautionPct"]),
    );
    expect(String(s.fieldErrors?.dutyCautionPct)).toMatch(/both were changed/);
    expect((s as { values?: Record<string, string> }).values?.currency).toBe("dollars");
  });
});

describe("members", () => {
  it("a tuner or counter cannot invite, change roles or remove members (403), and nothing changes", async () => {
    const [m] =
      await sql`select id from member where organization_id = ${DEMO_SHOP} and role = 'customer' limit 1`;
    const before = await fingerprint(["member", "invitation"]);
    for (const who of [tuner, counter, customer]) {
      expect(await invite(who, { email: "sneaky@example.test", role: "owner" })).toMatchObject({
        ok: false,
        status: 403,
      });
      expect(await changeRole(who, { memberId: m!.id, role: "owner" })).toMatchObject({
        ok: false,
        status: 403,
      });
      expect(await remove(who, { memberId: m!.id })).toMatchObject({ ok: false, status: 403 });
    }
    expect(await fingerprint(["member", "invitation"])).toBe(before);
  });

  it("the owner invites by e-mail once; a member or a pending invitation is a field error", async () => {
    const email = `invited-${Date.now()}@example.test`;
    const sent = await invite(otherOwner, { email, role: "counter" });
    expect(sent).toMatchObject({ ok: true, message: `Invitation sent to ${email}` });
    const [inv] =
      await sql`select id, role, status, organization_id from invitation where email = ${email}`;
    expect(inv).toMatchObject({
      role: "counter",
      status: "pending",
      organization_id: other.shopId,
    });
    const mail = await waitForMail(email, /invites you/);
    expect(mail.text).toContain(`/accept-invitation/${inv!.id}`);
    expect(mail.text).toMatch(/as Counter/);

    const before = await fingerprint(["member", "invitation"]);
    const again = await invite(otherOwner, { email, role: "tuner" });
    expect(again).toMatchObject({ ok: false, status: 422, code: "already_invited" });
    expect(again.fieldErrors?.email?.[0]).toMatch(/already has an invitation/);
    const member = await invite(otherOwner, { email: other.email, role: "tuner" });
    expect(member).toMatchObject({ ok: false, status: 422, code: "already_member" });
    expect(await fingerprint(["member", "invitation"])).toBe(before);
  });

  it("the last owner can neither step down nor leave; another shop's member is not found", async () => {
    const [self] = await sql`select id from member where user_id = ${other.userId}`;
    const [demoMember] =
      await sql`select id from member where organization_id = ${DEMO_SHOP} and role = 'tuner' limit 1`;
    const before = await fingerprint(["member"]);
    expect(await changeRole(otherOwner, { memberId: self!.id, role: "tuner" })).toMatchObject({
      ok: false,
      status: 409,
      code: "last_owner",
      message: "The shop needs at least one owner",
    });
    expect(await remove(otherOwner, { memberId: self!.id })).toMatchObject({
      status: 409,
      code: "last_owner",
    });
    expect(await changeRole(otherOwner, { memberId: self!.id, role: "owner" })).toMatchObject({
      ok: true,
      message: "No change",
    });
    expect(
      await changeRole(otherOwner, { memberId: demoMember!.id, role: "counter" }),
    ).toMatchObject({ ok: false, status: 404 });
    expect(await remove(otherOwner, { memberId: demoMember!.id })).toMatchObject({ status: 404 });
    expect(await fingerprint(["member"])).toBe(before);
  });

  it("with a second owner, the owner changes a role and removes a member", async () => {
    const [self] = await sql`select id from member where user_id = ${other.userId}`;
    // A second person in the other shop, made directly (its sign-up is tested elsewhere).
    const label = `${Date.now()}`;
    await sql`insert into "user" (id, name, email, email_verified) values (${"u-" + label}, 'Second Person', ${label + "@second.example.test"}, true)`;
    const [second] =
      await sql`insert into member (id, organization_id, user_id, role) values (${"m-" + label}, ${other.shopId}, ${"u-" + label}, 'tuner') returning id`;
    expect(await changeRole(otherOwner, { memberId: second!.id, role: "owner" })).toMatchObject({
      ok: true,
      message: "Role changed",
    });
    expect(await remove(otherOwner, { memberId: second!.id })).toMatchObject({
      ok: true,
      message: "Member removed",
    });
    expect(await sql`select 1 from member where id = ${second!.id}`).toHaveLength(0);
    // The only owner is back to one, and stays.
    expect(await remove(otherOwner, { memberId: self!.id })).toMatchObject({ status: 409 });
  });
});

describe("better-auth's organization endpoints", () => {
  const org = (who: Client, method: string, path: string, body?: unknown) =>
    request(who, method, `/api/auth/organization/${path}`, body);
  const TOUCHED = ["member", "invitation", "organization", "shop_settings"];

  it("a portal customer is no shop member there: 403 on every one, and no member or invitation in any answer", async () => {
    const people = (
      await sql`select u.email from member m join "user" u on u.id = m.user_id where m.organization_id = ${DEMO_SHOP} and u.email <> 'customer@demo.fuelwright.test'`
    ).map((r) => r.email as string);
    expect(people.length).toBeGreaterThan(2);
    const [{ slug }] =
      (await sql`select slug from organization where id = ${DEMO_SHOP}`) as never as [
        { slug: string },
      ];
    const [m] =
      await sql`select id from member where organization_id = ${DEMO_SHOP} and role = 'tuner' limit 1`;
    const before = await fingerprint(TOUCHED);
    const calls: [string, string, unknown?][] = [
      ["GET", "list-members"],
      ["GET", `list-members?organizationId=${DEMO_SHOP}`],
      ["GET", `list-members?organizationSlug=${slug}`],
      ["GET", "get-full-organization"],
      ["GET", `get-full-organization?organizationSlug=${slug}`],
      ["GET", "list-invitations"],
      ["GET", "get-active-member"],
      ["GET", "get-active-member-role"],
      ["GET", "list"],
      ["POST", "set-active", { organizationId: DEMO_SHOP }],
      ["POST", "invite-member", { email: "friend@customer.example.test", role: "customer" }],
      ["POST", "update-member-role", { memberId: m!.id, role: "customer" }],
      ["POST", "remove-member", { memberIdOrEmail: m!.id }],
      ["POST", "leave", { organizationId: DEMO_SHOP }],
    ];
    for (const [method, path, body] of calls) {
      const r = await org(customer, method, path, body);
      expect(r.status, `${method} ${path}`).toBe(403);
      for (const email of people) expect(r.text, `${method} ${path}`).not.toContain(email);
    }
    expect(await fingerprint(TOUCHED)).toBe(before);
  });

  it("staff still reach them: the owner and a tuner list the shop's members", async () => {
    for (const who of [owner, tuner]) {
      const r = await org(who, "GET", "list-members");
      expect(r.status).toBe(200);
      expect(r.json.members.map((x: { user: { email: string } }) => x.user.email)).toContain(
        "owner@demo.fuelwright.test",
      );
    }
    // Naming another shop where they are not staff: refused.
    expect((await org(tuner, "GET", `list-members?organizationId=${other.shopId}`)).status).toBe(
      403,
    );
  });

  it("the owner inviting or re-roling with a role the app does not know gets 400, and nothing is stored", async () => {
    const [self] = await sql`select id from member where user_id = ${other.userId}`;
    const before = await fingerprint(TOUCHED);
    for (const role of ["mechanic", "admin", "owner,admin", ["tuner", "superuser"], "", 7]) {
      const email = `odd-role-${Date.now()}@example.test`;
      const r = await org(otherOwner, "POST", "invite-member", { email, role });
      expect(r.status, JSON.stringify(role)).toBe(400);
      expect(r.json.message).toMatch(/Choose a role: owner, tuner, counter, customer/);
      const up = await org(otherOwner, "POST", "update-member-role", { memberId: self!.id, role });
      expect(up.status, JSON.stringify(role)).toBe(400);
    }
    expect(await fingerprint(TOUCHED)).toBe(before);
    // A role the app knows goes through.
    const email = `known-role-${Date.now()}@example.test`;
    const ok = await org(otherOwner, "POST", "invite-member", { email, role: "tuner" });
    expect(ok.status).toBe(200);
    expect((await sql`select role from invitation where email = ${email}`)[0]).toEqual({
      role: "tuner",
    });
  });

  it("the shop's name changes only on the Settings page: the plugin's update is refused and nothing changes", async () => {
    const before = await fingerprint(TOUCHED);
    for (const data of [{ name: "Line\nbreak shop" }, { name: "A fine name" }, { slug: "taken" }]) {
      const r = await org(otherOwner, "POST", "update", { data, organizationId: other.shopId });
      expect(r.status, JSON.stringify(data)).toBe(403);
      expect(r.json.message).toMatch(/Settings page/);
    }
    expect(await fingerprint(TOUCHED)).toBe(before);
  });
});
