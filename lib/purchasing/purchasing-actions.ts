"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import {
  IdSchema,
  PurchaseOrderCreateSchema,
  PurchaseOrderReceiveSchema,
  SupplierCreateSchema,
} from "@/lib/validations/operations";

import {
  createPurchaseOrder,
  createSupplier,
  receivePurchaseOrder,
  sendPurchaseOrder,
} from "./purchasing-commands";

/** The server actions of suppliers and purchase orders (staff): adapters over the commands. */

/** { name, … } → the new supplier. */
export const createSupplierAction = memberAction(SupplierCreateSchema, async (m, input) => {
  const s = await createSupplier(m, input);
  revalidatePath("/purchasing");
  return s;
});

/** { supplierId, lines } → the new draft purchase order. */
export const createPurchaseOrderAction = memberAction(
  PurchaseOrderCreateSchema,
  async (m, input) => {
    const po = await createPurchaseOrder(m, input);
    revalidatePath("/purchasing");
    return po;
  },
);

/** { id } of a draft → e-mailed to the supplier. */
export const sendPurchaseOrderAction = memberAction(IdSchema, async (m, input) => {
  const po = await sendPurchaseOrder(m, input);
  revalidatePath(`/purchasing/orders/${input.id}`);
  return po;
});

/** { id, lines: [{ lineId, quantity }] } → stock in, back-orders filled in acceptance order. */
export const receivePurchaseOrderAction = memberAction(
  PurchaseOrderReceiveSchema,
  async (m, input) => {
    const done = await receivePurchaseOrder(m, input);
    revalidatePath(`/purchasing/orders/${input.id}`);
    revalidatePath("/purchasing");
    revalidatePath("/jobs");
    return done;
  },
);
