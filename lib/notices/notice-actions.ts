"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { MailRetrySchema, NoticeOptSchema } from "@/lib/validations/operations";

import { retryNotice, setShopNotices } from "./notice-commands";

/** { id } of a failed e-mail → sent again (or failed again, logged). */
export const retryNoticeAction = memberAction(MailRetrySchema, async (m, input) => {
  const r = await retryNotice(m, input);
  revalidatePath("/jobs");
  return r;
});

/** { on } → whether this member gets the shop's notices. */
export const setShopNoticesAction = memberAction(NoticeOptSchema, (m, input) =>
  setShopNotices(m, input),
);
