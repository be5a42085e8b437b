"use client";

import { useActionState, useRef } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { deleteCustomerAction } from "../actions";

/** Delete with a confirmation dialog (native <dialog>: focus trap and Escape for free). */
export function DeleteCustomer({ id, name }: { id: string; name: string }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [state, action, pending] = useActionState(deleteCustomerAction, initialActionState);
  return (
    <>
      <Button variant="secondary" onClick={() => dialog.current?.showModal()}>
        Delete customer
      </Button>
      <dialog
        ref={dialog}
        className="m-auto rounded-lg p-6 shadow-xl backdrop:bg-ink-900/50"
        aria-labelledby="del-title"
      >
        <h2 id="del-title" className="text-lg font-semibold">
          Delete {name}?
        </h2>
        <p className="mt-2 text-sm text-ink-600">
          The customer and their details are removed for good.
        </p>
        <form action={action} className="mt-4 flex justify-end gap-2">
          <input type="hidden" name="id" value={id} />
          <Button type="button" variant="ghost" onClick={() => dialog.current?.close()}>
            Keep
          </Button>
          <Button type="submit" variant="danger" disabled={pending}>
            Delete
          </Button>
        </form>
        <FormStatus message={state.message} />
      </dialog>
    </>
  );
}
