import { isRole, ROLE_LABELS } from "@/lib/domain/roles";
import { serverEnv } from "@/lib/env";

/** Days an invitation to join a shop stays valid (the e-mail says so). */
export const INVITATION_DAYS = 7;

/** The e-mail that invites someone to a shop, with the link that lets them join. */
export function invitationMail(x: {
  id: string;
  email: string;
  role: string;
  shopName: string;
  inviterName: string;
}) {
  const url = `${serverEnv().APP_URL}/accept-invitation/${x.id}`;
  const role = isRole(x.role) ? ROLE_LABELS[x.role] : x.role;
  return {
    to: x.email,
    subject: `${x.shopName} invites you to Fuelwright`,
    text: `${x.inviterName} invites you to join ${x.shopName} on Fuelwright as ${role}.\n\nSet your password and join here (valid for ${INVITATION_DAYS} days):\n${url}\n`,
  };
}
