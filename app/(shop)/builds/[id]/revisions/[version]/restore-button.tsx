"use client";

import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { restoreRevisionAction } from "./actions";

export function RestoreButton(props: { buildId: string; version: number; currentVersion: number }) {
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string>();
  return (
    <div className="flex items-center gap-2">
      <Button
        disabled={pending}
        onClick={() => {
          if (
            !window.confirm(
              `Restore version ${props.version} as a new revision? The newer versions stay in the history.`,
            )
          )
            return;
          start(async () =>
            setMessage((await restoreRevisionAction(initialActionState, props)).message),
          );
        }}
      >
        Restore as new revision
      </Button>
      <FormStatus message={message} />
    </div>
  );
}
