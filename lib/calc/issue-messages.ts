// Reference: docs/calculations.md §9.
/*
 * Validation issues of the sizing schema re-said for their reader (apart from messages.ts: the
 * bounds come from the schema, which a page that only formats figures does not load).
 */
import { inputBounds } from "./input-bounds";
import {
  fillTemplate,
  formatNumber,
  formatValue,
  ownDecimals,
  QUANTITIES,
  type FigureParams,
} from "./quantities";
import { inputField } from "./registry";
import type { UnitSystem } from "./units";

/** What of a zod issue the messages read. */
export interface IssueLike {
  code: string;
  path: readonly PropertyKey[];
  message: string;
  origin?: string;
  /** What an invalid_type issue got ("Infinity" for a number too large to hold). */
  received?: string;
  params?: unknown;
}

/** Figures of a custom validation issue: `params: { template, figures }` set by the schema. */
interface TemplateParams {
  template: string;
  figures: FigureParams;
}
const isTemplateParams = (p: unknown): p is TemplateParams =>
  !!p &&
  typeof p === "object" &&
  typeof (p as TemplateParams).template === "string" &&
  typeof (p as TemplateParams).figures === "object";

/**
 * A sizing schema's validation issue as its reader should see it: the field by its label and
 * bounds in their units ("Boost must be between 0 and 72.5 psi"). Issues the registry cannot
 * say better keep the schema's own message.
 */
export function issueMessage(issue: IssueLike, system: UnitSystem): string {
  if (issue.code === "custom" && isTemplateParams(issue.params))
    return fillTemplate(issue.params.template, issue.params.figures, system);
  const path = issue.path.map(String).join(".");
  const field = inputField(path);
  if (!field?.quantity) return issue.message;
  const infinite =
    issue.code === "invalid_type" &&
    (issue.received === "Infinity" || issue.received === "-Infinity");
  if (
    ((issue.code === "too_small" || issue.code === "too_big") && issue.origin === "number") ||
    infinite
  ) {
    const b = inputBounds(path);
    if (b?.min === undefined || b.max === undefined) return issue.message;
    const q = field.quantity;
    const spec = QUANTITIES[q][system];
    // Bounds read best without trailing zeros: "between 0 and 72.5 psi".
    const trim = (t: string) => t.replace(/(\.\d*?)0+(?=\D*$)/, "$1").replace(/\.(?=\D*$)/, "");
    const low = trim(
      spec.prefix
        ? formatValue(q, b.min, system, ownDecimals(q, system, field.decimals))
        : formatNumber(q, b.min, system, ownDecimals(q, system, field.decimals)),
    );
    const high = trim(formatValue(q, b.max, system, ownDecimals(q, system, field.decimals)));
    return `${field.label} must be between ${low} and ${high}`;
  }
  return issue.message;
}

/** Field messages by path ("engine.maxBoostKpa" → message), the first issue of each path. */
export function issueMessages(
  issues: readonly IssueLike[],
  system: UnitSystem,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) out[i.path.map(String).join(".")] ??= issueMessage(i, system);
  return out;
}
