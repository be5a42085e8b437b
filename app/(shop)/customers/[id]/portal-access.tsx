"use client";

import { useActionState } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { invitePortalAction } from "../actions";

/** Whether the customer signs in to the portal, and an invitation button when not. */
export function PortalAccess({
  id,
  hasSignIn,
  email,
}: {
  id: string;
  hasSignIn: boolean;
  email: string | null;
}) {
  const [state, action, pending] = useActionState(invitePortalAction, initialActionState);
  if (hasSignIn)
    return (
      <p className="text-sm text-ok-700" data-testid="portal-access">
        ✓ Signs in to the portal: sees their own builds, spec sheets and quotes.
      </p>
    );
  return (
    <form action={action} className="space-y-2" aria-label="Portal invitation">
      <p className="text-sm text-ink-700" data-testid="portal-access">
        No portal sign-in yet.{" "}
        {email ? "Sending a quote invites them too." : "Add an e-mail address to invite them."}
      </p>
      <input type="hidden" name="id" value={id} />
      <div className="flex items-center gap-3">
        <Button type="submit" variant="secondary" disabled={pending || !email}>
          {pending ? "Sending…" : "Invite to the portal"}
        </Button>
        <FormStatus ok={state.ok} message={state.message} />
      </div>
    </form>
  );
}
