"use client";

import { useActionState, useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { acceptAsSignedInAction, acceptInvitationAction } from "../../actions";

export function AcceptForm({ invitationId }: { invitationId: string }) {
  const [state, action, pending] = useActionState(acceptInvitationAction, initialActionState);
  const e = state.fieldErrors ?? {};
  return (
    <form action={action} noValidate className="mt-6 space-y-4" aria-label="Accept invitation">
      <input type="hidden" name="invitationId" value={invitationId} />
      <Field
        label="Your name"
        name="name"
        autoComplete="name"
        defaultValue={state.values?.name}
        error={e.name}
      />
      <Field
        label="Choose a password"
        name="password"
        type="password"
        autoComplete="new-password"
        error={e.password}
        hint="At least 10 characters."
      />
      <FormStatus ok={state.ok} message={state.message} />
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Joining…" : "Join the shop"}
      </Button>
    </form>
  );
}

export function AcceptSignedInButton({ invitationId }: { invitationId: string }) {
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string>();
  return (
    <div className="mt-6">
      <Button
        disabled={pending}
        onClick={() =>
          start(async () => setMessage((await acceptAsSignedInAction(invitationId)).message))
        }
      >
        Accept invitation
      </Button>
      <FormStatus message={message} />
    </div>
  );
}
