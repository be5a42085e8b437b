import type { FieldIssue } from "@/lib/domain/errors";

/** NUL and the other C0 control characters but tab, line feed and carriage return; and DEL. */
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;

/** A field issue when `text` carries a control character no person types, else null. */
export function controlCharacterIssue(text: string, path: string): FieldIssue | null {
  return CONTROL.test(text)
    ? { path, message: "Remove the control characters (such as NUL) from this field" }
    : null;
}

/** Every string inside a parsed JSON value or form that carries a control character. */
export function controlCharacterIssues(value: unknown, path = ""): FieldIssue[] {
  if (typeof value === "string") {
    const issue = controlCharacterIssue(value, path || "(body)");
    return issue ? [issue] : [];
  }
  if (Array.isArray(value))
    return value.flatMap((v, i) => controlCharacterIssues(v, path ? `${path}.${i}` : String(i)));
  if (value && typeof value === "object")
    return Object.entries(value).flatMap(([k, v]) => [
      ...(CONTROL.test(k)
        ? [{ path: path || "(body)", message: "A field name is not valid" }]
        : []),
      ...controlCharacterIssues(v, path ? `${path}.${k}` : k),
    ]);
  return [];
}
