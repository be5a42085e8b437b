"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";

type Action = (prev: ActionState, payload: never) => Promise<ActionState>;

/**
 * One button that runs one server action with a fixed payload: asks first when `confirm` is
 * given (an issue, a send), then refreshes the page, goes to `goTo` (`{id}`: the answer's id) or,
 * with `openUrl`, opens the URL the action answered (a checkout).
 */
export function ActionButton({
  action,
  payload,
  label,
  busyLabel,
  confirm,
  goTo,
  openUrl,
  variant = "primary",
  disabled = false,
}: {
  action: Action;
  payload: unknown;
  label: string;
  busyLabel?: string;
  confirm?: string;
  goTo?: string;
  openUrl?: boolean;
  variant?: "primary" | "secondary";
  /** Not offered now (the reason is said beside it by the caller). */
  disabled?: boolean;
}) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [state, setState] = useState<ActionState>(initialActionState);
  const run = () => {
    if (confirm && !window.confirm(confirm)) return;
    start(async () => {
      const res = await action(initialActionState, payload as never);
      setState(res);
      if (!res.ok) return;
      const data = res.data as { id?: string; url?: string } | undefined;
      if (openUrl && data?.url) window.location.assign(data.url);
      else if (goTo) router.push(goTo.replace("{id}", data?.id ?? ""));
      else router.refresh();
    });
  };
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button variant={variant} onClick={run} disabled={pending || disabled} aria-busy={pending}>
        {pending ? (busyLabel ?? "Working…") : label}
      </Button>
      <FormStatus ok={state.ok} message={state.ok ? undefined : state.message} />
    </div>
  );
}
