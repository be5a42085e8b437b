import { isNoticeSubscriber } from "@/db/queries/mail-log";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { setShopNotices } from "@/lib/notices/notice-commands";
import { NoticeOptSchema } from "@/lib/validations/operations";

/** GET — whether the signed-in staff member gets the shop's notices. */
export const GET = handle(async () => {
  const m = await requireMember("notices:manage");
  return Response.json({ on: await isNoticeSubscriber(m.shopId, m.user.id) });
});

/** PUT { on } — get the shop's notices (quote answered, payment received, PO received) or not. */
export const PUT = handle(async (req) => {
  const m = await requireMember();
  return Response.json(await setShopNotices(m, NoticeOptSchema.parse(await readJson(req))));
});
