"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import {
  IdSchema,
  PurchaseOrderCancelSchema,
  PurchaseOrderCreateSchema,
  PurchaseOrderReceiveSchema,
  SupplierCreateSchema,
  SupplierUpdateSchema,
} from "@/lib/validations/operations";

import {
  cancelPurchaseOrder,
  createPurchaseOrder,
  createSupplier,
  receivePurchaseOrder,
  sendPurchaseOrder,
  updateSupplier,
} from "./purchasing-commands";

/** The server actions of suppliers and purchase orders (staff): adapters over the commands. */

/** { name, … } → the new supplier. */
export const createSupplierAction = memberAction(SupplierCreateSchema, async (m, input) => {
  const s = await createSupplier(m, input);
  revalidatePath("/purchasing");
  return s;
});

/** { id, version?, …fields, parts? } → the supplier as saved (`parts`: the whole list). */
export const updateSupplierAction = memberAction(SupplierUpdateSchema, async (m, input) => {
  const s = await updateSupplier(m, input);
  revalidatePath("/purchasing");
  revalidatePath(`/purchasing/suppliers/${input.id}`);
  return s;
});

/** { supplierId, lines } → the new draft purchase order (its `id` at the top, for the screen to open it). */
export const createPurchaseOrderAction = memberAction(
  PurchaseOrderCreateSchema,
  async (m, input) => {
    const po = await createPurchaseOrder(m, input);
    revalidatePath("/purchasing");
    return { ...po, id: po.po.id };
  },
);

/** { id } of a draft → e-mailed to the supplier. */
export const sendPurchaseOrderAction = memberAction(IdSchema, async (m, input) => {
  const po = await sendPurchaseOrder(m, input);
  revalidatePath(`/purchasing/orders/${input.id}`);
  return po;
});

/** { id, version } of an order nothing was received against → cancelled; back to the reorder list. */
export const cancelPurchaseOrderAction = memberAction(
  PurchaseOrderCancelSchema,
  async (m, input) => {
    const po = await cancelPurchaseOrder(m, input);
    revalidatePath(`/purchasing/orders/${input.id}`);
    revalidatePath("/purchasing");
    return { ...po, id: po.po.id };
  },
);

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
