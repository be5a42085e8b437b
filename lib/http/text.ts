import type { FieldIssue } from "@/lib/domain/errors";

/** NUL and the other C0 control characters but tab, line feed and carriage return; and DEL. */
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
/**
 * Half of a surrogate pair with no other half: no character at all. JSON can carry one
 * (`"\ud800"`); PostgreSQL's jsonb refuses it and its text columns would keep a replacement sign.
 */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/**
 * A field issue when `text` carries what no person types — a control character, or half of a
 * character (a lone surrogate) — else null.
 */
export function controlCharacterIssue(text: string, path: string): FieldIssue | null {
  if (CONTROL.test(text))
    return { path, message: "Remove the control characters (such as NUL) from this field" };
  if (LONE_SURROGATE.test(text))
    return {
      path,
      message: "This field has half of a character in it (broken Unicode); type it again",
    };
  return null;
}

/** Every string inside a parsed JSON value or form that carries a control character or half of one. */
export function controlCharacterIssues(value: unknown): FieldIssue[] {
  // An explicit stack, not recursion: a hostile body may nest thousands of levels deep. Each
  // object once: a server action's arguments may refer to themselves.
  const issues: FieldIssue[] = [];
  const seen = new WeakSet<object>();
  const stack: [unknown, string][] = [[value, ""]];
  while (stack.length) {
    const [v, path] = stack.pop()!;
    if (v && typeof v === "object") {
      if (seen.has(v)) continue;
      seen.add(v);
    }
    if (typeof v === "string") {
      const issue = controlCharacterIssue(v, path || "(body)");
      if (issue) issues.push(issue);
    } else if (Array.isArray(v)) {
      v.forEach((x, i) => stack.push([x, path ? `${path}.${i}` : String(i)]));
    } else if (v && typeof v === "object") {
      for (const [k, x] of Object.entries(v)) {
        if (CONTROL.test(k) || LONE_SURROGATE.test(k))
          issues.push({ path: path || "(body)", message: "A field name is not valid" });
        stack.push([x, path ? `${path}.${k}` : k]);
      }
    }
  }
  return issues.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
}
