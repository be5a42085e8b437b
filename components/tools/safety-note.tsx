import { SAFETY_POINTS, SAFETY_TITLE } from "@/lib/safety";

export function SafetyNote() {
  return (
    <aside
      aria-label="Safety"
      className="mt-8 rounded-lg border-l-4 border-caution-600 bg-caution-50 p-4 text-sm text-ink-800"
    >
      <p className="font-semibold">▲ {SAFETY_TITLE}</p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {SAFETY_POINTS.map((p) => (
          <li key={p}>{p}</li>
        ))}
      </ul>
    </aside>
  );
}
