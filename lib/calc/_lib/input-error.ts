// Reference: docs/calculations.md §8.
/** Thrown when a library function is called with input it cannot work with. */
export class CalcInputError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = "CalcInputError";
    this.field = field;
  }
}

/** Throws a CalcInputError unless `value` is a finite number within [min, max]. */
export function requireRange(
  field: string,
  value: number,
  min: number,
  max: number,
  label = field,
): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new CalcInputError(field, `${label} must be a number`);
  }
  if (value < min || value > max) {
    throw new CalcInputError(field, `${label} must be between ${min} and ${max}`);
  }
  return value;
}

/** Throws unless `value` is a finite number strictly above zero (and at most max). */
export function requirePositive(
  field: string,
  value: number,
  max = Number.MAX_SAFE_INTEGER,
  label = field,
): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0 || value > max) {
    throw new CalcInputError(
      field,
      `${label} must be a number above 0${max < Number.MAX_SAFE_INTEGER ? ` and at most ${max}` : ""}`,
    );
  }
  return value;
}
