import "server-only";

import type { z } from "zod";

import {
  deleteCustomerIfUnused,
  getCustomer,
  createCustomer as insertCustomer,
  updateCustomer as patchCustomer,
  shopCountry,
  type CustomerWithVehicles,
} from "@/db/queries/customers";
import { ensurePortalInvitation } from "@/db/queries/shops";
import { deleteVehicle, getVehicle, insertVehicle, patchVehicle } from "@/db/queries/vehicles";
import type { Vehicle } from "@/db/schema";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, Invalid, NotFound, Unavailable } from "@/lib/domain/errors";
import { vinProblem } from "@/lib/domain/vin";
import { serverEnv } from "@/lib/env";
import { readPhone } from "@/lib/format/phone";
import { sendMail } from "@/lib/mail";
import type { CustomerCreate, CustomerInput, CustomerPatch } from "@/lib/validations/customers";
import type { VehicleAddSchema, VehicleUpdate } from "@/lib/validations/vehicles";

/**
 * The customer records' writes: one command per write. Each checks the member's permission
 * first and throws domain errors only (lib/domain/errors).
 */

/**
 * The phone number as stored: E.164, read with the shop's country as the default; blank (null)
 * clears it, left out (undefined) keeps it. One that cannot be read as a number is a field error.
 */
async function storedPhone(shopId: string, phone: string | null | undefined, stored?: string) {
  if (!phone) return phone;
  const r = readPhone(phone, await shopCountry(shopId));
  if (r.ok) return r.e164;
  // A number kept as typed before numbers were read, sent back unchanged, stays.
  if (phone === stored) return undefined;
  throw Invalid.field("phone", r.message, "invalid_phone");
}

/** A new customer (with their vehicles, from the API), the phone number stored as E.164. */
export async function createCustomer(
  member: Member,
  input: CustomerInput | CustomerCreate,
): Promise<CustomerWithVehicles> {
  authorize(member, "customers:write");
  const { vehicles = [], ...fields } = input as CustomerCreate;
  return insertCustomer(
    member.shopId,
    { ...fields, phone: (await storedPhone(member.shopId, fields.phone)) ?? null },
    vehicles,
  );
}

/**
 * Changes only the fields sent (the edit form sends all of its own; the API may send one), from
 * the version the edit started from when it names one (stale → Conflict with the record as it
 * is now). Values equal to the stored ones change nothing; the answer is the record.
 */
export async function updateCustomer(
  member: Member,
  input: CustomerPatch,
): Promise<CustomerWithVehicles> {
  authorize(member, "customers:write");
  const { id, version, vehicles, ...fields } = input;
  const before = fields.phone ? await getCustomer(member.shopId, id) : null;
  const phone = await storedPhone(member.shopId, fields.phone, before?.phone ?? undefined);
  return patchCustomer(
    member.shopId,
    id,
    { ...fields, ...(phone === undefined ? {} : { phone }) },
    version,
    vehicles,
  );
}

/** Adds a vehicle to one of the shop's customers. */
export async function addVehicle(
  member: Member,
  input: z.output<typeof VehicleAddSchema>,
): Promise<Vehicle> {
  authorize(member, "customers:write");
  const { customerId, ...v } = input;
  return insertVehicle(member.shopId, customerId, v);
}

/**
 * Changes the fields sent of one of the shop's vehicles (equal values write nothing). A VIN
 * sent without a year is checked against the stored year.
 */
export async function updateVehicle(member: Member, input: VehicleUpdate): Promise<Vehicle> {
  authorize(member, "customers:write");
  const { id, ...fields } = input;
  if (fields.vin && fields.year === undefined) {
    const stored = await getVehicle(member.shopId, id);
    if (!stored) throw new NotFound("That vehicle");
    const problem = vinProblem(fields.vin, stored.year);
    if (problem) throw Invalid.field("vin", problem);
  }
  return patchVehicle(member.shopId, id, fields);
}

/** Removes one of the shop's vehicles; builds that named it keep the vehicle as text. */
export async function removeVehicle(member: Member, input: { id: string }): Promise<Vehicle> {
  authorize(member, "customers:write");
  return deleteVehicle(member.shopId, input.id);
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
