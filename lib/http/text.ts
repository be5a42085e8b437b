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
        if (CONTROL.test(k))
          issues.push({ path: path || "(body)", message: "A field name is not valid" });
        stack.push([x, path ? `${path}.${k}` : k]);
      }
    }
  }
  return issues.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
}
