"use client";

import { useState, useTransition } from "react";

import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { setShopNoticesAction } from "@/lib/notices/notice-actions";

/** A staff member chooses to get the shop's notices by e-mail (quotes answered, payments, receipts). */
export function NoticeToggle({ on }: { on: boolean }) {
  const [checked, setChecked] = useState(on);
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<{ ok: boolean; text: string }>();
  const change = (next: boolean) =>
    start(async () => {
      const res = await setShopNoticesAction(initialActionState, { on: next });
      if (res.ok) {
        setChecked(next);
        setMessage({ ok: true, text: next ? "You will get the shop's notices" : "Notices off" });
      } else setMessage({ ok: false, text: res.message ?? "Not saved; try again" });
    });
  return (
    <div>
      <label className="flex items-start gap-2 text-sm text-ink-800">
        <input
          type="checkbox"
          className="mt-1 h-4 w-4"
          checked={checked}
          disabled={pending}
          onChange={(e) => change(e.target.checked)}
        />
        <span>
          E-mail me when a customer accepts or declines a quote, a payment comes in, or a purchase
          order is received.
        </span>
      </label>
      <FormStatus ok={message?.ok} message={message?.text} />
    </div>
  );
}
