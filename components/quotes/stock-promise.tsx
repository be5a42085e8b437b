import { Signal } from "@/components/ui/status";
import { promiseText, type LinePromise } from "@/lib/catalog/stock";

/**
 * The quote's part lines and what they are promised: before acceptance what accepting now would
 * hold (the rest back-ordered, with its expected day), afterwards what is held. The same text on
 * the counter's quote page and in the customer's portal.
 */
export function StockPromise({
  lines,
  promises,
  holding,
  summary,
  audience,
}: {
  lines: { description: string }[];
  promises: (LinePromise | null)[];
  holding: boolean;
  summary: string;
  audience: "counter" | "customer";
}) {
  const rows = promises.flatMap((p, i) => (p ? [{ p, line: lines[i]! }] : []));
  if (rows.length === 0) return null;
  const short = rows.some((r) => r.p.backOrdered > 0);
  const title = holding
    ? "Parts held"
    : audience === "customer"
      ? "Parts if you accept now"
      : "Parts if accepted now";
  return (
    <section
      aria-labelledby="q-stock"
      className="mt-6 rounded-lg border border-ink-200 bg-white p-5"
      data-testid="stock-promise"
    >
      <h2 id="q-stock" className="text-lg font-semibold">
        {title}
      </h2>
      <p className="mt-1 text-sm text-ink-700" data-testid="stock-summary">
        {summary}
      </p>
      <ul className="mt-2 space-y-1 text-sm">
        {rows.map(({ p, line }, i) => (
          <li key={i} className="flex flex-wrap items-center gap-2">
            <span className="font-medium">{line.description}</span>
            {p.backOrdered > 0 ? (
              <Signal level="caution">Back-ordered</Signal>
            ) : (
              <Signal level="ok">{holding ? "Held" : "In stock"}</Signal>
            )}
            <span className="text-ink-700" data-testid="stock-line">
              {promiseText(p, holding)}
            </span>
          </li>
        ))}
      </ul>
      {short && !holding ? (
        <p className="mt-2 text-xs text-ink-600">
          {audience === "customer"
            ? "Stock is held when you accept, first come first served; this shows it as of now."
            : "Stock is held when the customer accepts, first come first served; this shows it as of now."}
        </p>
      ) : null}
    </section>
  );
}
