import { headers } from "next/headers";

import { findUserByEmail, getInvitation } from "@/db/queries/shops";
import { invitationProblem } from "@/lib/accounts/account-commands";
import { auth } from "@/lib/auth/server";
import { isRole, ROLE_LABELS } from "@/lib/domain/roles";

import { AcceptForm, AcceptSignedInButton } from "./accept-form";

export default async function AcceptInvitationPage({
  params,
}: {
  params: Promise<{ id: string }>;
}) {
  const { id } = await params;
  const inv = await getInvitation(id);
  const bad = invitationProblem(inv);
  if (bad || !inv) {
    return (
      <>
        <h1 className="text-2xl font-bold">Invitation</h1>
        <p className="mt-4 text-danger-700">✕ {bad}</p>
      </>
    );
  }
  const role = isRole(inv.invitation.role) ? ROLE_LABELS[inv.invitation.role] : "member";
  const session = await auth.api.getSession({ headers: await headers() });
  const existing = await findUserByEmail(inv.invitation.email);
  return (
    <>
      <h1 className="text-2xl font-bold">Join {inv.shopName}</h1>
      <p className="mt-2 text-ink-700">
        You are invited as <strong>{role}</strong> with the e-mail{" "}
        <strong>{inv.invitation.email}</strong>.
      </p>
      {existing ? (
        session?.user.email === inv.invitation.email ? (
          <AcceptSignedInButton invitationId={id} />
        ) : (
          <p className="mt-4 text-ink-700">
            This e-mail already has an account.{" "}
            <a className="text-copper-600 underline" href="/sign-in">
              Sign in
            </a>{" "}
            as {inv.invitation.email}, then open this link again.
          </p>
        )
      ) : (
        <AcceptForm invitationId={id} />
      )}
    </>
  );
}
