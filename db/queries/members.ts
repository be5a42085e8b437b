import { and, asc, desc, eq, gt, sql } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";

import { db } from "@/db";
import {
  invitation,
  member,
  organization,
  session,
  SHOP_SIZING_COLUMNS,
  shopSettings,
  user,
  type ShopSizingColumns,
} from "@/db/schema";
import { keptLookup } from "@/db/session-cache";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";

/**
 * The membership a session acts with: the session's shop if it names one, else the person's
 * first shop. Null when the person is not (or no longer) a member.
 */
export async function sessionMembership(userId: string, shopId: string | null) {
  const [row] = await db
    .select({ role: member.role, shopId: member.organizationId, shopName: organization.name })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(
      shopId
        ? and(eq(member.userId, userId), eq(member.organizationId, shopId))
        : eq(member.userId, userId),
    )
    .orderBy(asc(member.createdAt))
    .limit(1);
  return row ?? null;
}

/** A person's role in one shop, named by its id or its slug; null when not a member there. */
export async function roleInShop(
  userId: string,
  shop: { id: string } | { slug: string },
): Promise<string | null> {
  const [row] = await db
    .select({ role: member.role })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(
      and(
        eq(member.userId, userId),
        "id" in shop ? eq(organization.id, shop.id) : eq(organization.slug, shop.slug),
      ),
    )
    .limit(1);
  return row?.role ?? null;
}

/** The shop a new session starts in: the person's first membership, or null. */
export async function firstShopOf(userId: string): Promise<string | null> {
  const [row] = await db
    .select({ shopId: member.organizationId })
    .from(member)
    .where(eq(member.userId, userId))
    .orderBy(asc(member.createdAt))
    .limit(1);
  return row?.shopId ?? null;
}

/** Is an invitation to this e-mail still pending in any shop? (Its link proves the address.) */
export async function hasPendingInvitation(email: string): Promise<boolean> {
  const [row] = await db
    .select({ id: invitation.id })
    .from(invitation)
    .where(and(eq(invitation.email, email), eq(invitation.status, "pending")))
    .limit(1);
  return Boolean(row);
}

export async function listMembers(shopId: string) {
  return db
    .select({
      id: member.id,
      role: member.role,
      userId: member.userId,
      name: user.name,
      email: user.email,
      createdAt: member.createdAt,
    })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, shopId))
    .orderBy(asc(member.createdAt));
}

export async function listPendingInvitations(shopId: string) {
  return db
    .select()
    .from(invitation)
    .where(and(eq(invitation.organizationId, shopId), eq(invitation.status, "pending")))
    .orderBy(desc(invitation.createdAt));
}

/** Is someone with this e-mail already a member of the shop? */
export async function isMemberByEmail(shopId: string, email: string): Promise<boolean> {
  const [row] = await db
    .select({ id: member.id })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, shopId), eq(user.email, email)))
    .limit(1);
  return Boolean(row);
}

/** Is an invitation of the shop to this e-mail pending and not yet expired? */
export async function hasOpenInvitation(shopId: string, email: string): Promise<boolean> {
  const [row] = await db
    .select({ id: invitation.id })
    .from(invitation)
    .where(
      and(
        eq(invitation.organizationId, shopId),
        eq(invitation.email, email),
        eq(invitation.status, "pending"),
        gt(invitation.expiresAt, new Date()),
      ),
    )
    .limit(1);
  return Boolean(row);
}

/** Records an invitation (its id is the secret of the e-mailed link). */
export async function insertInvitation(
  shopId: string,
  values: { id: string; email: string; role: string; inviterId: string; expiresAt: Date },
) {
  const [row] = await db
    .insert(invitation)
    .values({ ...values, organizationId: shopId, status: "pending" })
    .returning({ id: invitation.id, email: invitation.email, expiresAt: invitation.expiresAt });
  return row!;
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * The shop's members, locked until the transaction ends, with the one asked for: two owners
 * demoting each other at once cannot leave the shop without an owner.
 */
async function lockedMembers(tx: Tx, shopId: string, memberId: string) {
  const rows = await tx
    .select({ id: member.id, role: member.role })
    .from(member)
    .where(eq(member.organizationId, shopId))
    .for("update");
  const target = rows.find((r) => r.id === memberId);
  if (!target) throw new NotFound("That member");
  const owners = rows.filter((r) => r.role === "owner").length;
  return { target, owners };
}

const LAST_OWNER = () => new Conflict("The shop needs at least one owner", "last_owner");

/** Gives a member another role; the last owner stays an owner. False when nothing changed. */
export async function setMemberRole(
  shopId: string,
  memberId: string,
  role: string,
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const { target, owners } = await lockedMembers(tx, shopId, memberId);
    if (target.role === role) return false;
    if (target.role === "owner" && owners <= 1) throw LAST_OWNER();
    await tx
      .update(member)
      .set({ role })
      .where(and(eq(member.organizationId, shopId), eq(member.id, memberId)));
    return true;
  });
}

/** Removes a member from the shop; the last owner stays. */
export async function removeMember(shopId: string, memberId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const { target, owners } = await lockedMembers(tx, shopId, memberId);
    if (target.role === "owner" && owners <= 1) throw LAST_OWNER();
    await tx.delete(member).where(and(eq(member.organizationId, shopId), eq(member.id, memberId)));
  });
}

/** A session found by its token, with its person and the membership it acts with (if any). */
export interface SessionMemberRow {
  expiresAt: Date;
  userId: string;
  userName: string;
  userEmail: string;
  role: string | null;
  shopId: string | null;
  shopName: string | null;
  /**
   * The sizing columns of that shop's settings row, read in the same round trip (so the sizing
   * route needs no second one); null when the shop has no settings row or there is no shop.
   */
  shopSizing: ShopSizingColumns | null;
}

interface SessionMemberSqlRow {
  expires_at: Date | string;
  user_id: string;
  user_name: string;
  user_email: string;
  role: string | null;
  shop_id: string | null;
  shop_name: string | null;
  /** json_build_object of the sizing columns (a string if the driver leaves json unparsed), or null. */
  shop_sizing: ShopSizingColumns | string | null;
}

/**
 * The look-up's text, rendered once with `$1` for the token: it is sent as a named prepared
 * statement (parsed and planned once per connection) and drizzle does not build it again on
 * every request — this query runs before every signed-in request's own work.
 */
let sessionMemberSql: string | undefined;
/** `'designDutyPct', ss.design_duty_pct, …`: every column of SHOP_SIZING_COLUMNS, by its key. */
const sizingPairs = () =>
  sql.raw(SHOP_SIZING_COLUMNS.map((k) => `'${k}', ss.${shopSettings[k].name}`).join(", "));
function sessionMemberText(): string {
  sessionMemberSql ??= new PgDialect().sqlToQuery(sql`
    select s.expires_at, u.id as user_id, u.name as user_name, u.email as user_email,
           m.role, m.shop_id, m.shop_name,
           case when ss.shop_id is null then null else json_build_object(${sizingPairs()}) end as shop_sizing
    from ${session} s
    join ${user} u on u.id = s.user_id
    left join lateral (
      select mm.role, mm.organization_id as shop_id, o.name as shop_name
      from ${member} mm
      join ${organization} o on o.id = mm.organization_id
      where mm.user_id = s.user_id
        and (s.active_organization_id is null or mm.organization_id = s.active_organization_id)
      order by mm.created_at asc
      limit 1
    ) m on true
    left join ${shopSettings} ss on ss.shop_id = m.shop_id
    where s.token = ${"$token"}
    limit 1`).sql;
  return sessionMemberSql;
}

/**
 * The session of `token`, its person, membership (as `sessionMembership` chooses it) and the
 * sizing part of that shop's settings in one round trip — the look-up every signed-in request
 * makes first. Null when no session has it. Kept in memory between requests (db/session-cache.ts)
 * until anything it read changes: a revoked session or a changed setting shows on the writer's
 * very next request, and on every other instance's once the database's notice has reached it.
 */
export async function sessionMemberByToken(token: string): Promise<SessionMemberRow | null> {
  return keptLookup(serverEnv().DATABASE_URL, token, () => readSessionMember(token));
}

async function readSessionMember(token: string): Promise<SessionMemberRow | null> {
  const rows = await db.$client.unsafe<SessionMemberSqlRow[]>(sessionMemberText(), [token], {
    prepare: true,
  });
  const r = rows[0];
  if (!r) return null;
  return {
    expiresAt: new Date(r.expires_at),
    userId: r.user_id,
    userName: r.user_name,
    userEmail: r.user_email,
    role: r.role,
    shopId: r.shop_id,
    shopName: r.shop_name,
    shopSizing:
      typeof r.shop_sizing === "string"
        ? (JSON.parse(r.shop_sizing) as ShopSizingColumns)
        : r.shop_sizing,
  };
}
