import { toNestErrors, validateFieldsNatively } from "@hookform/resolvers";
import type { FieldError, FieldValues, Resolver } from "react-hook-form";

/**
 * A react-hook-form resolver from a plain check (field → message; `lib/validations/form-checks`)
 * instead of `zodResolver` and the schema library. It answers as `zodResolver` does — the
 * field's first message, highlighted and focused the same way, at the same moments (on submit,
 * then as the field changes) — and hands the form's values on unchanged: the server action or
 * endpoint parses them with the schema.
 */
export function checkResolver<T extends FieldValues>(
  check: (values: T) => Partial<Record<string, string>>,
): Resolver<T> {
  return (values, _context, options) => {
    const messages = Object.entries(check(values)).filter(
      (e): e is [string, string] => e[1] !== undefined,
    );
    if (messages.length === 0) {
      if (options.shouldUseNativeValidation) validateFieldsNatively({}, options);
      return { values, errors: {} };
    }
    const errors: Record<string, FieldError> = {};
    for (const [name, message] of messages) errors[name] = { type: "validation", message };
    return { values: {}, errors: toNestErrors(errors, options) };
  };
}
