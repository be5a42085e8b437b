"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import useSWR from "swr";

import { Button } from "@/components/ui/button";
import { EmptyState, FormStatus, Signal } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { chooseKitAction } from "@/lib/builds/build-actions";
import type { UnitSystem } from "@/lib/calc";
import { fillTemplate } from "@/lib/calc/quantities";
import { fitLabels } from "@/lib/catalog/fit-labels";
import { formatMoney } from "@/lib/catalog/money";
import type { Candidate } from "@/lib/catalog/recommend";
import { type ChosenPart, type KitRole } from "@/lib/domain/builds";
import { fetcher } from "@/lib/fetcher";
import { createQuoteAction } from "@/lib/quotes/quote-actions";

interface Kit {
  buildVersion: number;
  chosen: ChosenPart[];
  roles: { role: KitRole; label: string; needed: boolean; candidates: Candidate[] }[];
}

const key = (c: { part: { id: string }; quantity: number }) => `${c.part.id}:${c.quantity}`;

/** Ranked parts per role with the reasons; choosing writes them into the build and sizes it with their data. */
export function KitPicker({
  buildId,
  currency,
  canChoose,
  canQuote,
  quoteOnly = false,
  units = "metric",
}: {
  buildId: string;
  currency: string;
  canChoose: boolean;
  canQuote: boolean;
  /** The counter: a choice goes to the quote only, the build's sizing stays the tuner's. */
  quoteOnly?: boolean;
  /** The person's unit system: the reasons' figures are read in it. */
  units?: UnitSystem;
}) {
  const router = useRouter();
  const { data, error, isLoading, mutate } = useSWR<Kit>(`/api/v1/builds/${buildId}/kit`, fetcher);
  // What the person changed; every other role shows the chosen part, else the best that fits.
  const [override, setPick] = useState<Partial<Record<KitRole, string>>>({});
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();

  if (isLoading) return <p aria-live="polite">Working out the kit…</p>;
  if (error)
    return (
      <p role="alert" className="text-danger-700">
        ✕ {error.message}
      </p>
    );
  if (!data) return null;
  const pick: Partial<Record<KitRole, string>> = {};
  for (const r of data.roles) {
    const chosen = data.chosen.find((c) => c.role === r.role);
    const best = r.candidates.find((c) => c.fits);
    pick[r.role] =
      r.role in override
        ? override[r.role]
        : chosen
          ? `${chosen.partId}:${chosen.quantity}`
          : r.needed && best
            ? key(best)
            : undefined;
  }
  if (data.roles.every((r) => r.candidates.length === 0))
    return (
      <EmptyState title="No parts to choose from">
        Add injectors, pumps and lines to the catalog (Parts → Import CSV).
      </EmptyState>
    );

  const total = data.roles.reduce((sum, r) => {
    const c = r.candidates.find((x) => key(x) === pick[r.role]);
    return sum + (c ? c.part.priceMinor * c.quantity : 0);
  }, 0);

  const choose = () =>
    start(async () => {
      const parts = data.roles.flatMap((r) => {
        const v = pick[r.role];
        if (!v) return [];
        const [partId, qty] = v.split(":");
        return [{ role: r.role, partId: partId!, quantity: Number(qty) }];
      });
      const res = await chooseKitAction(initialActionState, {
        id: buildId,
        version: data.buildVersion,
        parts,
      });
      if (res.ok && res.data) {
        setStatus({
          ok: true,
          message: quoteOnly
            ? `Parts kept for the quote (version ${res.data.build.version}); the build's sizing did not change`
            : `Parts written into the build as version ${res.data.build.version}`,
        });
        await mutate();
        setPick({});
        router.refresh();
      } else setStatus({ ok: false, message: res.message ?? "The parts were not written" });
    });

  const quote = () =>
    start(async () => {
      const res = await createQuoteAction(initialActionState, { buildId });
      if (res.ok && res.data) router.push(`/quotes/${res.data.id}`);
      else setStatus({ ok: false, message: res.message ?? "The quote was not made" });
    });

  return (
    <div className="space-y-4">
      {quoteOnly && canChoose ? (
        <p
          role="note"
          data-testid="kit-quote-only"
          className="rounded-lg border border-ink-300 bg-ink-100 p-4 text-sm text-ink-800"
        >
          The parts you choose here go on the quote only. The build&apos;s sizing (injectors, pump,
          lines) is the tuner&apos;s and stays as it is; where your choice differs, the tuner sees
          it on the build&apos;s revisions.
        </p>
      ) : null}
      {data.roles.map((r) => {
        const labels = fitLabels(r.candidates);
        return (
          <fieldset
            key={r.role}
            className="rounded-lg border border-ink-200 bg-white p-4"
            disabled={!canChoose}
          >
            <legend className="px-1 font-display text-lg font-semibold">
              {r.label}
              {!r.needed ? " (not needed)" : ""}
            </legend>
            {r.candidates.length === 0 ? (
              <p className="text-sm text-ink-600">No {r.label.toLowerCase()} in the catalog.</p>
            ) : null}
            <ul className="space-y-2">
              <li>
                <label className="flex items-center gap-2 text-sm">
                  <input
                    type="radio"
                    name={r.role}
                    checked={!pick[r.role]}
                    onChange={() => setPick((p) => ({ ...p, [r.role]: undefined }))}
                  />{" "}
                  None
                </label>
              </li>
              {r.candidates.slice(0, 6).map((c, i) => (
                <li key={key(c)}>
                  <label className="flex items-start gap-2 text-sm">
                    <input
                      type="radio"
                      className="mt-1"
                      name={r.role}
                      checked={pick[r.role] === key(c)}
                      onChange={() => setPick((p) => ({ ...p, [r.role]: key(c) }))}
                      aria-label={`${r.label}: ${c.quantity} × ${c.part.sku}`}
                    />
                    <span className="min-w-0 [overflow-wrap:anywhere]">
                      <span className="font-medium">
                        {c.quantity > 1 ? `${c.quantity} × ` : ""}
                        {c.part.brand} {c.part.name}
                      </span>{" "}
                      <span className="figure text-ink-600">
                        {c.part.sku} · {formatMoney(c.part.priceMinor, currency)}
                      </span>{" "}
                      <span data-testid="kit-verdict">
                        <Signal
                          level={
                            !c.fits ? "danger" : c.stock.free < c.stock.needed ? "caution" : "ok"
                          }
                        >
                          {labels[i]}
                        </Signal>
                      </span>
                      <span className="block text-ink-700">
                        {c.why.map((r) => fillTemplate(r.text, r.params, units)).join("; ")}
                      </span>
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        );
      })}
      <div className="sticky bottom-0 flex flex-wrap items-center gap-3 border-t border-ink-200 bg-ink-50 py-3">
        <span className="figure font-semibold">Parts {formatMoney(total, currency)}</span>
        {canChoose ? (
          <Button onClick={choose} disabled={pending}>
            {pending ? "Working…" : quoteOnly ? "Use these parts for the quote" : "Use these parts"}
          </Button>
        ) : null}
        {canQuote && data.chosen.length ? (
          <Button variant="secondary" onClick={quote} disabled={pending}>
            Create quote from the chosen parts
          </Button>
        ) : null}
        <FormStatus ok={status?.ok} message={status?.message} />
      </div>
    </div>
  );
}
