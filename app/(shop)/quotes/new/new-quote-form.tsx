"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button, LinkButton } from "@/components/ui/button";
import { SearchCombobox } from "@/components/ui/search-combobox";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { formatMoney, parseScaled } from "@/lib/catalog/money";
import { createQuoteAction } from "@/lib/quotes/quote-actions";
import { LABOUR_DESCRIPTION } from "@/lib/quotes/quote-lines";
import { presentQuote } from "@/lib/quotes/quote-presentation";

interface Customer {
  id: string;
  name: string;
  email: string | null;
  phone: string | null;
}
interface Part {
  id: string;
  sku: string;
  brand: string;
  name: string;
  priceMinor: number;
  stock: number;
  reserved: number;
}
interface Line {
  part: Part;
  qty: string;
}

const freeText = (free: number) =>
  free > 0 ? `${free} free` : free < 0 ? `${-free} short` : "none free";

/**
 * A parts-only quote: a customer, parts found as you type in the catalog, and labour at the
 * shop's rate if wanted — no build needed. Creating it opens the quote to fine-tune and send.
 */
export function NewQuoteForm({
  customer: initial,
  currency,
  taxRateBp,
  labourRateMinor,
}: {
  customer: Customer | null;
  currency: string;
  taxRateBp: number;
  labourRateMinor: number;
}) {
  const router = useRouter();
  const [customer, setCustomer] = useState<Customer | null>(initial);
  const [lines, setLines] = useState<Line[]>([]);
  const [labour, setLabour] = useState("");
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  const money = (m: number) => formatMoney(m, currency);

  const qtys = lines.map((l) => parseScaled(l.qty, 3));
  const hours = labour.trim() === "" ? 0 : parseScaled(labour, 3);
  const badQty = qtys.map((q) => q === null || q === 0);
  const badHours = hours === null || hours > 1_000_000;
  const shown = presentQuote({ currency, taxRateBp }, [
    ...lines.map((l, i) => ({
      kind: "part" as const,
      sku: l.part.sku,
      description: `${l.part.brand} ${l.part.name}`,
      quantityMilli: qtys[i] ?? 0,
      unitPriceMinor: l.part.priceMinor,
      discountBp: 0,
    })),
    ...(hours
      ? [
          {
            kind: "labour" as const,
            sku: null,
            description: LABOUR_DESCRIPTION,
            quantityMilli: hours,
            unitPriceMinor: labourRateMinor,
            discountBp: 0,
          },
        ]
      : []),
  ]);

  const create = () =>
    start(async () => {
      if (!customer) return;
      const res = await createQuoteAction(initialActionState, {
        customerId: customer.id,
        lines: lines.map((l, i) => ({
          kind: "part",
          partId: l.part.id,
          sku: l.part.sku,
          description: `${l.part.brand} ${l.part.name}`,
          quantityMilli: qtys[i]!,
          unitPriceMinor: l.part.priceMinor,
          discountBp: 0,
        })),
        ...(hours ? { labourHours: hours / 1000 } : {}),
      });
      if (res.ok && res.data) {
        setStatus({ ok: true, message: "Quote made; opening it" });
        router.push(`/quotes/${res.data.id}`);
      } else {
        const first = Object.values(res.fieldErrors ?? {})[0]?.[0];
        setStatus({ ok: false, message: first ?? res.message ?? "The quote was not made" });
      }
    });

  return (
    <div className="space-y-5">
      <section className="rounded-lg border border-ink-200 bg-white p-4">
        <h2 className="text-lg font-semibold">Customer</h2>
        {customer ? (
          <p className="mt-1" data-testid="quote-customer">
            <span className="font-medium">{customer.name}</span>
            {customer.email ? ` · ${customer.email}` : " · no e-mail address"}{" "}
            <LinkButton onClick={() => setCustomer(null)}>change</LinkButton>
          </p>
        ) : (
          <SearchCombobox<{ customers: Customer[] }, Customer>
            label="Find the customer"
            placeholder="Name, e-mail or phone"
            url={(q) => `/api/v1/customers?${new URLSearchParams({ q, limit: "8" })}`}
            options={(r) =>
              r.customers.map((c) => ({
                id: c.id,
                label: c.name,
                detail: [c.email, c.phone].filter(Boolean).join(" · ") || undefined,
                value: c,
              }))
            }
            empty="No customer matches; add them on the Customers page"
            onPick={setCustomer}
          />
        )}
      </section>

      <section className="rounded-lg border border-ink-200 bg-white p-4">
        <h2 className="text-lg font-semibold">Parts</h2>
        <SearchCombobox<{ parts: Part[] }, Part>
          label="Add a part from the catalog"
          placeholder="Type a SKU, name or brand"
          url={(q) => `/api/v1/parts?${new URLSearchParams({ q, sort: "name", limit: "8" })}`}
          options={(r) =>
            r.parts.map((p) => ({
              id: p.id,
              label: `${p.sku} — ${p.brand} ${p.name}`,
              detail: `${money(p.priceMinor)} · ${freeText(p.stock - p.reserved)}`,
              value: p,
            }))
          }
          empty="No part matches; try another SKU, name or brand"
          onPick={(p) =>
            setLines((ls) =>
              ls.some((l) => l.part.id === p.id)
                ? ls.map((l) =>
                    l.part.id === p.id
                      ? { ...l, qty: String((parseScaled(l.qty, 3) ?? 0) / 1000 + 1) }
                      : l,
                  )
                : [...ls, { part: p, qty: "1" }],
            )
          }
        />
        {lines.length === 0 ? (
          <p className="mt-2 text-sm text-ink-600">No parts yet: search the catalog above.</p>
        ) : (
          <ul className="mt-2 divide-y divide-ink-100" data-testid="new-quote-lines">
            {lines.map((l, i) => (
              <li key={l.part.id} className="flex flex-wrap items-center gap-3 py-2 text-sm">
                <span className="min-w-48 flex-1">
                  {l.part.brand} {l.part.name}
                  <span className="block text-xs text-ink-600">
                    {l.part.sku} · {money(l.part.priceMinor)} each
                  </span>
                </span>
                <label className="flex items-center gap-2">
                  <span>Qty</span>
                  <input
                    aria-label={`Quantity of ${l.part.sku}`}
                    aria-invalid={badQty[i]}
                    inputMode="decimal"
                    value={l.qty}
                    onChange={(e) =>
                      setLines((ls) =>
                        ls.map((x, k) => (k === i ? { ...x, qty: e.target.value } : x)),
                      )
                    }
                    className="figure w-20 rounded-md border border-ink-300 px-2 py-1 text-right aria-[invalid=true]:border-danger-600"
                  />
                </label>
                <span className="figure w-24 text-right">{shown.lines[i]!.lineTotal}</span>
                <LinkButton
                  aria-label={`Remove ${l.part.sku}`}
                  onClick={() => setLines((ls) => ls.filter((_, k) => k !== i))}
                >
                  remove
                </LinkButton>
              </li>
            ))}
          </ul>
        )}
        <div className="mt-3">
          <label htmlFor="nq-labour" className="block text-sm font-medium text-ink-700">
            Labour hours at {money(labourRateMinor)} an hour (optional)
          </label>
          <input
            id="nq-labour"
            inputMode="decimal"
            value={labour}
            aria-invalid={badHours}
            aria-describedby={badHours ? "nq-labour-err" : undefined}
            onChange={(e) => setLabour(e.target.value)}
            className="figure mt-1 w-28 rounded-md border border-ink-300 px-2 py-1 text-right aria-[invalid=true]:border-danger-600"
          />
          {badHours ? (
            <p id="nq-labour-err" role="alert" className="mt-1 text-sm text-danger-700">
              ✕ Hours like 1.5, at most 1000
            </p>
          ) : null}
        </div>
        <p className="mt-3 text-right text-sm" data-testid="new-quote-total">
          Subtotal <span className="figure">{shown.subtotal}</span> · {shown.taxLabel}{" "}
          <span className="figure">{shown.tax}</span> ·{" "}
          <span className="font-semibold">
            Total <span className="figure">{shown.total}</span>
          </span>
        </p>
      </section>

      <div className="flex flex-wrap items-center gap-3">
        <Button
          onClick={create}
          disabled={pending || !customer || badHours || badQty.some(Boolean)}
        >
          {pending ? "Making the quote…" : "Create quote"}
        </Button>
        {!customer ? (
          <span className="text-sm text-ink-600">Choose the customer first.</span>
        ) : null}
        <FormStatus ok={status?.ok} message={status?.message} />
      </div>
    </div>
  );
}
