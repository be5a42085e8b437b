"use client";

import { useState, useTransition } from "react";

import { copyBuildAction } from "@/app/(shop)/builds/[id]/copy-actions";
import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";

export function CopyBuildButton({ buildId }: { buildId: string }) {
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string>();
  return (
    <span className="inline-flex items-center gap-2">
      <Button
        variant="secondary"
        disabled={pending}
        onClick={() => start(async () => setMessage((await copyBuildAction(buildId)).message))}
      >
        {pending ? "Copying…" : "Copy as next power step"}
      </Button>
      <FormStatus message={message} />
    </span>
  );
}
