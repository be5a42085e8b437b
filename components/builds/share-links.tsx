"use client";

import { useState, useTransition } from "react";
import useSWR from "swr";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { LocalTime } from "@/components/ui/local-time";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { fetcher } from "@/lib/fetcher";
import { createShareLinkAction, revokeShareLinkAction } from "@/lib/shares/share-actions";

interface Link {
  id: string;
  expiresAt: string;
  revokedAt: string | null;
  createdAt: string;
  active: boolean;
}

/** Expiring, revocable links to this build's spec sheet for people without an account. */
export function ShareLinks({ buildId }: { buildId: string }) {
  const { data, mutate } = useSWR<{ links: Link[] }>(
    `/api/v1/builds/${buildId}/share-links`,
    fetcher,
  );
  const [days, setDays] = useState("14");
  const [url, setUrl] = useState<string | null>(null);
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  return (
    <section
      aria-labelledby="share"
      className="mt-8 rounded-lg border border-ink-200 bg-white p-5 print:hidden"
    >
      <h2 id="share" className="text-xl font-semibold">
        Share the spec sheet
      </h2>
      <div className="mt-2 flex flex-wrap items-end gap-3">
        <SelectField
          label="Link works for"
          id="share-days"
          value={days}
          onChange={(e) => setDays(e.target.value)}
        >
          {["1", "7", "14", "30", "90"].map((d) => (
            <option key={d} value={d}>
              {d} day{d === "1" ? "" : "s"}
            </option>
          ))}
        </SelectField>
        <Button
          variant="secondary"
          disabled={pending}
          onClick={() =>
            start(async () => {
              const res = await createShareLinkAction(initialActionState, {
                buildId,
                days: Number(days),
              });
              if (res.ok && res.data) {
                setUrl(res.data.url);
                setStatus({ ok: true, message: "Link made: copy it now, it is shown only once" });
                await mutate();
              } else setStatus({ ok: false, message: res.message ?? "The link was not made" });
            })
          }
        >
          Make a link
        </Button>
        <FormStatus ok={status?.ok} message={status?.message} />
      </div>
      {url ? (
        <div className="mt-3 flex flex-wrap items-center gap-2">
          <label htmlFor="share-url" className="sr-only">
            Share link
          </label>
          <input
            id="share-url"
            readOnly
            value={url}
            className="figure min-w-96 flex-1 rounded-md border border-ink-300 bg-ink-50 px-3 py-2 text-sm"
            onFocus={(e) => e.currentTarget.select()}
          />
          <Button variant="ghost" onClick={() => void navigator.clipboard?.writeText(url)}>
            Copy
          </Button>
        </div>
      ) : null}
      {data && data.links.length ? (
        <ul className="mt-3 divide-y divide-ink-100 text-sm">
          {data.links.map((l) => {
            const state = l.revokedAt ? (
              "withdrawn"
            ) : !l.active ? (
              "expired"
            ) : (
              <>
                works until <LocalTime value={l.expiresAt} />
              </>
            );
            return (
              <li key={l.id} className="flex items-center gap-3 py-2">
                <span className="figure text-ink-600">
                  made <LocalTime value={l.createdAt} />
                </span>
                <span className="flex-1">{state}</span>
                {l.active ? (
                  <Button
                    variant="ghost"
                    onClick={() =>
                      window.confirm(
                        "Withdraw this link? Anyone holding it loses access at once.",
                      ) &&
                      start(async () => {
                        const res = await revokeShareLinkAction(initialActionState, { id: l.id });
                        setStatus(
                          res.ok
                            ? { ok: true, message: "Link withdrawn" }
                            : { ok: false, message: res.message ?? "The link was not withdrawn" },
                        );
                        await mutate();
                      })
                    }
                  >
                    Withdraw
                  </Button>
                ) : null}
              </li>
            );
          })}
        </ul>
      ) : null}
    </section>
  );
}
