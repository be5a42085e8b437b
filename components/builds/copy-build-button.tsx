"use client";

import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { copyBuildAction } from "@/lib/builds/build-actions";

export function CopyBuildButton({ buildId }: { buildId: string }) {
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string>();
  return (
    <span className="inline-flex items-center gap-2">
      <Button
        variant="secondary"
        disabled={pending}
        onClick={() =>
          start(async () =>
            // On success the action opens the new build; only a refusal comes back.
            setMessage((await copyBuildAction(initialActionState, { id: buildId })).message),
          )
        }
      >
        {pending ? "Copying…" : "Copy as next power step"}
      </Button>
      <FormStatus message={message} />
    </span>
  );
}
