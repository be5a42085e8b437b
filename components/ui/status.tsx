import type { ReactNode } from "react";

export { FormStatus } from "./form-status";

/** Signal badge: colour plus a symbol plus a word, never colour alone. */
export function Signal({
  level,
  children,
  testId,
}: {
  level: "ok" | "info" | "caution" | "danger";
  children: ReactNode;
  /** `data-testid` of the text (without the symbol), for tests that read a record's status. */
  testId?: string;
}) {
  const map = {
    ok: ["bg-ok-50 text-ok-700 ring-ok-600/30", "✓"],
    info: ["bg-ink-100 text-ink-700 ring-ink-400/30", "i"],
    caution: ["bg-caution-50 text-caution-700 ring-caution-600/40", "▲"],
    danger: ["bg-danger-50 text-danger-700 ring-danger-600/40", "■"],
  } as const;
  const [cls, sym] = map[level];
  return (
    <span
      className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ring-1 ${cls}`}
    >
      <span aria-hidden="true">{sym}</span>
      {testId ? <span data-testid={testId}>{children}</span> : children}
    </span>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-300 bg-white p-8 text-center">
      <p className="font-display text-lg font-semibold text-ink-800">{title}</p>
      {children ? <div className="mt-2 text-sm text-ink-600">{children}</div> : null}
    </div>
  );
}

export function PageHeader({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <h1 className="text-3xl font-bold text-ink-900">{title}</h1>
      {children}
    </div>
  );
}
