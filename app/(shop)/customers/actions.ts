"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";

import { createCustomer, deleteCustomer, updateCustomer } from "@/db/queries/customers";
import { getShopSettings } from "@/db/queries/shops";
import { memberAction } from "@/lib/actions/member-action";
import { PATHS } from "@/lib/cache-tags";
import { NotFound } from "@/lib/domain/errors";
import { invitePortalCustomer } from "@/lib/portal/invite";
import { CustomerSchema, CustomerUpdateSchema } from "@/lib/validations/customers";

export const createCustomerAction = memberAction(
  "customers:write",
  CustomerSchema,
  async (data, m) => {
    const c = await createCustomer(m.shopId, data);
    revalidatePath(PATHS.customers);
    return { ok: true, message: `Customer ${c.name} added`, values: { id: c.id } };
  },
);

export const updateCustomerAction = memberAction(
  "customers:write",
  CustomerUpdateSchema,
  async ({ id, ...data }, m) => {
    const c = await updateCustomer(m.shopId, id, data);
    if (!c) throw new NotFound("That customer");
    revalidatePath(PATHS.customers);
    revalidatePath(PATHS.customer(id));
    return { ok: true, message: "Saved" };
  },
);

const DeleteSchema = z.object({ id: z.uuid("Unknown customer") });
export const deleteCustomerAction = memberAction(
  "customers:write",
  DeleteSchema,
  async ({ id }, m) => {
    if (!(await deleteCustomer(m.shopId, id))) throw new NotFound("That customer");
    revalidatePath(PATHS.customers);
    redirect(PATHS.customers);
  },
);

const InviteSchema = z.object({ id: z.uuid("Unknown customer") });
/** Sends the customer a portal invitation by e-mail. */
export const invitePortalAction = memberAction(
  "customers:write",
  InviteSchema,
  async ({ id }, m) => {
    const settings = await getShopSettings(m.shopId);
    const { to } = await invitePortalCustomer(
      m.shopId,
      settings?.name ?? "Your shop",
      m.user.id,
      id,
    );
    revalidatePath(PATHS.customer(id));
    return { ok: true, message: `Portal invitation sent to ${to}` };
  },
);
