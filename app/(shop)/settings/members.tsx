"use client";

import { useActionState, useRef } from "react";

import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/domain/roles";

import { changeRoleAction, inviteMemberAction, removeMemberAction } from "./actions";

export function InviteForm() {
  const [state, action, pending] = useActionState(inviteMemberAction, initialActionState);
  const e = state.fieldErrors ?? {};
  return (
    <form action={action} noValidate className="mt-2 space-y-3" aria-label="Invite member">
      <Field
        id="invite-email"
        label="E-mail"
        name="email"
        type="email"
        defaultValue={state.ok ? "" : state.values?.email}
        error={e.email}
      />
      <SelectField
        id="invite-role"
        label="Role"
        name="role"
        defaultValue={state.values?.role ?? "tuner"}
        error={e.role}
      >
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </SelectField>
      <Button type="submit" disabled={pending}>
        {pending ? "Sending…" : "Send invitation"}
      </Button>
      <FormStatus ok={state.ok} message={state.message} />
    </form>
  );
}

export function MemberRow({
  member,
  editable,
}: {
  member: { id: string; name: string; email: string; role: Role };
  editable: boolean;
}) {
  const [roleState, roleAction, rolePending] = useActionState(changeRoleAction, initialActionState);
  const [removeState, removeAction, removePending] = useActionState(
    removeMemberAction,
    initialActionState,
  );
  const dialog = useRef<HTMLDialogElement>(null);
  return (
    <li className="py-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div>
          <p className="font-medium">{member.name}</p>
          <p className="text-sm text-ink-600">{member.email}</p>
        </div>
        {editable ? (
          <div className="flex items-center gap-2">
            <form action={roleAction} className="flex items-end gap-2">
              <input type="hidden" name="memberId" value={member.id} />
              <SelectField
                id={`role-${member.id}`}
                label={`Role of ${member.name}`}
                name="role"
                defaultValue={member.role}
              >
                {ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </SelectField>
              <Button type="submit" variant="secondary" disabled={rolePending}>
                Change
              </Button>
            </form>
            <Button
              variant="ghost"
              onClick={() => dialog.current?.showModal()}
              aria-label={`Remove ${member.name}`}
            >
              Remove
            </Button>
            <dialog ref={dialog} className="m-auto rounded-lg p-6 shadow-xl backdrop:bg-ink-900/50">
              <p className="font-semibold">Remove {member.name} from the shop?</p>
              <form action={removeAction} className="mt-4 flex justify-end gap-2">
                <input type="hidden" name="memberId" value={member.id} />
                <Button type="button" variant="ghost" onClick={() => dialog.current?.close()}>
                  Keep
                </Button>
                <Button type="submit" variant="danger" disabled={removePending}>
                  Remove
                </Button>
              </form>
            </dialog>
          </div>
        ) : (
          <span className="text-sm font-semibold text-ink-700">{ROLE_LABELS[member.role]}</span>
        )}
      </div>
      <FormStatus
        ok={roleState.ok || removeState.ok}
        message={roleState.message ?? removeState.message}
      />
    </li>
  );
}
