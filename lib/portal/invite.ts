import "server-only";

import { getCustomer } from "@/db/queries/customers";
import { ensurePortalInvitation } from "@/db/queries/shops";
import { NotFound } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";
import { HttpError } from "@/lib/http/http-error";
import { sendMail } from "@/lib/mail";

/** The link with which a customer without a sign-in sets a password and opens their portal. */
export async function portalInviteLink(
  shopId: string,
  inviterId: string,
  email: string,
): Promise<string> {
  const inv = await ensurePortalInvitation(shopId, inviterId, email);
  return `${serverEnv().APP_URL}/accept-invitation/${inv.id}`;
}

/** The counter invites a customer to the portal by e-mail (the quote e-mail does this by itself). */
export async function invitePortalCustomer(
  shopId: string,
  shopName: string,
  inviterId: string,
  customerId: string,
) {
  const c = await getCustomer(shopId, customerId);
  if (!c) throw new NotFound("That customer");
  if (c.userId)
    throw new HttpError(409, "already_invited", `${c.name} already signs in to the portal`);
  if (!c.email)
    throw new HttpError(422, "no_email", `${c.name} has no e-mail address; add one first`);
  const link = await portalInviteLink(shopId, inviterId, c.email);
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
    throw new HttpError(
      502,
      "mail_failed",
      "The invitation was not sent: the mail server did not take it. Try again.",
    );
  }
  return { to: c.email };
}
