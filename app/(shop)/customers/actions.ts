"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { memberAction } from "@/lib/actions/member-action";
import { PATHS } from "@/lib/cache-tags";
import {
  addVehicle,
  createCustomer,
  deleteCustomer,
  inviteToPortal,
  removeVehicle,
  updateCustomer,
  updateVehicle,
} from "@/lib/customers/customer-commands";
import {
  CustomerIdSchema,
  CustomerSchema,
  CustomerUpdateSchema,
} from "@/lib/validations/customers";
import { VehicleAddSchema, VehicleIdSchema, VehicleUpdateSchema } from "@/lib/validations/vehicles";

export const createCustomerAction = memberAction(CustomerSchema, async (m, input) => {
  const c = await createCustomer(m, input);
  revalidatePath(PATHS.customers);
  // The new customer's own address, so a reload stays on their page (a push from the browser
  // after the action raced the list's refresh and left /customers in the address bar).
  redirect(PATHS.customer(c.id));
});

/**
 * The same command and partial semantics as `PATCH /api/v1/customers/:id`: the customer as
 * saved (or as it was, when nothing changed); a stale version is a 409 state with `current`.
 */
export const updateCustomerAction = memberAction(CustomerUpdateSchema, async (m, input) => {
  const customer = await updateCustomer(m, input);
  revalidatePath(PATHS.customers);
  revalidatePath(PATHS.customer(input.id));
  return { ok: true, message: "Saved", data: { customer } };
});

export const deleteCustomerAction = memberAction(CustomerIdSchema, async (m, input) => {
  await deleteCustomer(m, input);
  revalidatePath(PATHS.customers);
  redirect(PATHS.customers);
});

/** Sends the customer a portal invitation by e-mail. */
export const invitePortalAction = memberAction(CustomerIdSchema, async (m, input) => {
  const { to } = await inviteToPortal(m, input);
  revalidatePath(PATHS.customer(input.id));
  return { ok: true, message: `Portal invitation sent to ${to}` };
});

/** "Add a vehicle" on the customer page. */
export const addVehicleAction = memberAction(VehicleAddSchema, async (m, input) => {
  const v = await addVehicle(m, input);
  revalidatePath(PATHS.customer(v.customerId));
  return { ok: true, message: `${v.year} ${v.make} ${v.model} added`, data: { vehicle: v } };
});

/** A vehicle's edit form: the fields sent change (equal values write nothing). */
export const updateVehicleAction = memberAction(VehicleUpdateSchema, async (m, input) => {
  const v = await updateVehicle(m, input);
  revalidatePath(PATHS.customer(v.customerId));
  return { ok: true, message: "Vehicle saved", data: { vehicle: v } };
});

/** Removes a vehicle (after the page's confirmation); builds keep the vehicle as text. */
export const deleteVehicleAction = memberAction(VehicleIdSchema, async (m, input) => {
  const v = await removeVehicle(m, input);
  revalidatePath(PATHS.customer(v.customerId));
  return { ok: true, message: `${v.year} ${v.make} ${v.model} removed` };
});
