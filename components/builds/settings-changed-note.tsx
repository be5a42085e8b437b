import type { ReactNode } from "react";

import type { InputChange } from "@/lib/builds/diff";

/**
 * "Sized under older settings": a build's saved version was sized with the shop's settings of
 * the time, and today's would size it differently. Says which version (`heading`), what the
 * page beneath shows (`children`), each setting that changed (before → after, in the reader's
 * units) and, when given, what to do about it (`action`). The build sheet and the kit show it;
 * nothing is shown when nothing changed.
 */
export function SettingsChangedNote({
  changes,
  heading,
  children,
  action,
  className = "",
}: {
  changes: InputChange[];
  heading: ReactNode;
  children: ReactNode;
  action?: ReactNode;
  className?: string;
}) {
  if (changes.length === 0) return null;
  return (
    <div
      role="status"
      data-testid="settings-changed"
      className={`rounded-lg border border-caution-600 bg-caution-50 p-4 text-sm text-ink-800 ${className}`}
    >
      <p className="font-semibold">▲ {heading}</p>
      <p className="mt-1">{children}</p>
      <ul className="mt-1 list-inside list-disc">
        {changes.map((c) => (
          <li key={c.path}>
            {c.label}: <span className="figure">{c.before}</span> →{" "}
            <span className="figure">{c.after}</span>
          </li>
        ))}
      </ul>
      {action}
    </div>
  );
}
