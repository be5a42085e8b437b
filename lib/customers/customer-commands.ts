import "server-only";

import {
  deleteCustomerIfUnused,
  getCustomer,
  createCustomer as insertCustomer,
  updateCustomer as patchCustomer,
} from "@/db/queries/customers";
import { ensurePortalInvitation } from "@/db/queries/shops";
import type { Customer } from "@/db/schema";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, Invalid, NotFound, Unavailable } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";
import { sendMail } from "@/lib/mail";
import type { CustomerInput, CustomerUpdate } from "@/lib/validations/customers";

/**
 * The customer records' writes: one command per write. Each checks the member's permission
 * first and throws domain errors only (lib/domain/errors).
 */

export async function createCustomer(member: Member, input: CustomerInput): Promise<Customer> {
  authorize(member, "customers:write");
  return insertCustomer(member.shopId, input);
}

/**
 * Changes only the fields sent (the edit form sends all of its own; the API may send one), from
 * the version the edit started from when it names one (stale → Conflict with the record as it
 * is now). Values equal to the stored ones change nothing; the answer is the record.
 */
export async function updateCustomer(member: Member, input: CustomerUpdate): Promise<Customer> {
  authorize(member, "customers:write");
  const { id, version, ...fields } = input;
  return patchCustomer(member.shopId, id, fields, version);
}

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? "" : "s"}`;

/**
 * Deletes a customer record. One with quotes or builds is kept (those records name them):
 * Conflict `customer_in_use`, and nothing is deleted.
 */
export async function deleteCustomer(member: Member, input: { id: string }): Promise<void> {
  authorize(member, "customers:write");
  const r = await deleteCustomerIfUnused(member.shopId, input.id);
  if (r.deleted) return;
  const uses = [
    r.quotes ? plural(r.quotes, "quote") : "",
    r.builds ? plural(r.builds, "build") : "",
  ].filter(Boolean);
  throw new Conflict(
    `${r.name} has ${uses.join(" and ")}, so the record cannot be deleted; quotes and builds keep their customer`,
    "customer_in_use",
  );
}

/** The link with which a customer without a sign-in sets a password and opens their portal. */
async function portalInviteLink(shopId: string, inviterId: string, email: string): Promise<string> {
  const inv = await ensurePortalInvitation(shopId, inviterId, email);
  return `${serverEnv().APP_URL}/accept-invitation/${inv.id}`;
}

/** The counter invites a customer to the portal by e-mail (the quote e-mail does this by itself). */
export async function inviteToPortal(
  member: Member,
  input: { id: string },
): Promise<{ to: string }> {
  authorize(member, "customers:write");
  const c = await getCustomer(member.shopId, input.id);
  if (!c) throw new NotFound("That customer");
  if (c.userId) throw new Conflict(`${c.name} already signs in to the portal`, "already_invited");
  if (!c.email)
    throw Invalid.field("email", `${c.name} has no e-mail address; add one first`, "no_email");
  const link = await portalInviteLink(member.shopId, member.user.id, c.email);
  const shopName = member.shopName;
  const text = [
    `Hello ${c.name},`,
    "",
    `${shopName} keeps your fuel system's build sheets, spec sheets and quotes in a portal for you.`,
    "Set your password and open it here (the link is valid for 14 days):",
    link,
    "",
    `— ${shopName}`,
  ].join("\n");
  try {
    await sendMail({ to: c.email, subject: `${shopName}: your customer portal`, text });
  } catch {
    throw new Unavailable(
      "The invitation was not sent: the mail server did not take it. Try again.",
      "mail_failed",
    );
  }
  return { to: c.email };
}
