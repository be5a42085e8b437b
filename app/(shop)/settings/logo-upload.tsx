"use client";

import { useRouter } from "next/navigation";
import { useRef, useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { LocalTime } from "@/components/ui/local-time";
import { FormStatus } from "@/components/ui/status";
import { api } from "@/lib/api-client";

const MAX = 1024 * 1024;

/** The shop's logo for its spec sheets and quotes: upload (PNG or JPEG, ≤ 1 MB), replace, remove. */
export function LogoUpload({
  logo,
  canEdit,
}: {
  logo: { width: number; height: number; version: string; uploadedAt: string } | null;
  canEdit: boolean;
}) {
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [pending, start] = useTransition();
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const upload = (file: File | undefined) => {
    if (!file) return;
    if (file.size > MAX)
      return setStatus({ ok: false, message: "The logo is larger than 1 MB; save it smaller" });
    if (!["image/png", "image/jpeg"].includes(file.type))
      return setStatus({ ok: false, message: "The logo must be a PNG or JPEG image" });
    start(async () => {
      setStatus(null);
      const res = await api("PUT", "/api/v1/shop/logo", undefined, {
        body: file,
        headers: { "content-type": file.type },
      });
      setStatus(
        res.ok
          ? { ok: true, message: "Logo saved; it is on new PDFs from now on" }
          : { ok: false, message: res.message },
      );
      if (input.current) input.current.value = "";
      if (res.ok) router.refresh();
    });
  };
  const remove = () => {
    if (!window.confirm("Remove the shop's logo from its PDFs?")) return;
    start(async () => {
      const res = await api("DELETE", "/api/v1/shop/logo");
      setStatus(
        res.ok ? { ok: true, message: "Logo removed" } : { ok: false, message: res.message },
      );
      if (res.ok) router.refresh();
    });
  };
  return (
    <section aria-labelledby="logo-h" className="mt-8 border-t border-ink-100 pt-6">
      <h3 id="logo-h" className="text-lg font-semibold">
        Logo on PDFs
      </h3>
      {logo ? (
        <div className="mt-2 flex items-center gap-4">
          {/* eslint-disable-next-line @next/next/no-img-element -- a private, per-shop image behind the session */}
          <img
            src={`/api/v1/shop/logo?v=${logo.version}`}
            alt="The shop's current logo"
            className="max-h-16 max-w-48 rounded border border-ink-200 bg-white object-contain p-1"
            data-testid="logo-preview"
          />
          <p className="text-sm text-ink-600">
            {logo.width} × {logo.height} px, uploaded{" "}
            <LocalTime value={logo.uploadedAt} kind="date" />
          </p>
        </div>
      ) : (
        <p className="mt-1 text-sm text-ink-600">
          No logo yet: the PDFs show the shop&apos;s name alone.
        </p>
      )}
      {canEdit ? (
        <div className="mt-3 flex flex-wrap items-center gap-3">
          <label className="text-sm font-medium text-ink-800">
            {logo ? "Replace the logo" : "Upload a logo"}{" "}
            <span className="font-normal text-ink-600">(PNG or JPEG, up to 1 MB)</span>
            <input
              ref={input}
              type="file"
              accept="image/png,image/jpeg"
              className="mt-1 block text-sm"
              disabled={pending}
              onChange={(e) => upload(e.target.files?.[0])}
            />
          </label>
          {logo ? (
            <Button type="button" variant="secondary" onClick={remove} disabled={pending}>
              Remove logo
            </Button>
          ) : null}
          {pending ? (
            <span role="status" className="text-sm text-ink-700">
              Uploading…
            </span>
          ) : null}
        </div>
      ) : null}
      <FormStatus ok={status?.ok} message={status?.message} />
    </section>
  );
}
