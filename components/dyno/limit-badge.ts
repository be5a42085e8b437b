import type { LimitCheck } from "@/lib/calc/tune";
import { LIMIT_LABELS, type LimitKey } from "@/lib/calc/tune-labels";

/** A limit's name inside a sentence: "injector duty", "EGT spread between cylinders". */
export function limitName(key: LimitKey): string {
  const l = LIMIT_LABELS[key];
  return /^[A-Z]{2}/.test(l) ? l : l.charAt(0).toLowerCase() + l.slice(1);
}

/** "a", "a and b", "a, b and c". */
export function listOf(names: string[]): string {
  return names.length < 2
    ? (names[0] ?? "")
    : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
}

/**
 * The pull card's badge: every limit the pull is over ("Over: injector duty", "Over 3 limits:
 * injector duty, exhaust gas temperature and EGT spread between cylinders"), else every limit it
 * is near, else within every limit logged; null when no limit was judged.
 */
export function pullBadge(
  checks: Pick<LimitCheck, "key" | "status">[],
): { status: "over" | "near" | "within"; text: string } | null {
  for (const status of ["over", "near"] as const) {
    const names = checks.filter((c) => c.status === status).map((c) => limitName(c.key));
    const word = status === "over" ? "Over" : "Near";
    if (names.length === 1) return { status, text: `${word}: ${names[0]}` };
    if (names.length > 1)
      return { status, text: `${word} ${names.length} limits: ${listOf(names)}` };
  }
  return checks.some((c) => c.status === "within")
    ? { status: "within", text: "Within every limit logged" }
    : null;
}
