// Reference: docs/calculations.md §8 (input limits).
import type { VolumeToAddQuery } from "./blend";

/**
 * The blend mixer's fields, their names and limits (canonical units), and the messages the
 * schema gives for them — without the schema library, for the tools page, which checks as the
 * user types. `schema.ts#VolumeToAddSchema` is built from the same table, and
 * `tests/unit/blend-bounds.test.ts` holds both to the same messages.
 */
export interface FieldBound {
  label: string;
  min: number;
  max: number;
  unit: string;
  optional?: boolean;
}

export const VOLUME_TO_ADD_FIELDS = {
  tankVolumeL: { label: "Fuel in the tank", min: 0, max: 100000, unit: "L" },
  tankEthanolVolPct: { label: "Ethanol content in the tank", min: 0, max: 100, unit: "%" },
  addedEthanolVolPct: { label: "Ethanol content of the added fuel", min: 0, max: 100, unit: "%" },
  targetEthanolVolPct: { label: "Target ethanol content", min: 0, max: 100, unit: "%" },
  tankCapacityL: { label: "Tank capacity", min: 0.1, max: 100000, unit: "L", optional: true },
} as const satisfies Record<keyof VolumeToAddQuery, FieldBound>;

/** The message of one number field, as the schema words it; undefined when it is fine. */
export function boundMessage(f: FieldBound, value: unknown): string | undefined {
  const u = f.unit ? ` ${f.unit}` : "";
  if (value === undefined) return f.optional ? undefined : `${f.label} is required`;
  if (typeof value !== "number" || Number.isNaN(value)) return `${f.label} must be a number`;
  if (!Number.isFinite(value) || value < f.min || value > f.max)
    return `${f.label} must be between ${f.min} and ${f.max}${u}`;
  return undefined;
}

/** Each field's message (only the fields with one); none: `q` is a valid query. */
export function volumeToAddIssues(
  q: Partial<Record<keyof VolumeToAddQuery, unknown>>,
): Partial<Record<keyof VolumeToAddQuery, string>> {
  const out: Partial<Record<keyof VolumeToAddQuery, string>> = {};
  for (const [k, f] of Object.entries(VOLUME_TO_ADD_FIELDS)) {
    const m = boundMessage(f, q[k as keyof VolumeToAddQuery]);
    if (m) out[k as keyof VolumeToAddQuery] = m;
  }
  return out;
}
