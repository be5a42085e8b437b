/**
 * Checks on a POST to a page (a server action) that the framework would otherwise fail on with
 * a server error: a path that is not valid percent-encoding, a body that does not decode, a
 * reference to a part of the body that is not there. Each is the client's fault: 400 (or 415
 * for a body of another type), said in the API's JSON error shape. `proxy.ts` runs them before
 * the action; what passes is decoded by React as usual, and the action's own checks follow.
 */

export interface EdgeRefusal {
  status: number;
  code: string;
  message: string;
}

const refusal = (status: number, code: string, message: string): EdgeRefusal => ({
  status,
  code,
  message,
});

/** True when a segment of the raw path is not valid percent-encoding (`%zz`, `%E0%A4%A`). */
export function undecodablePath(pathname: string): boolean {
  for (const segment of pathname.split("/")) {
    try {
      decodeURIComponent(segment);
    } catch {
      return true;
    }
  }
  return false;
}

const mediaType = (header: string | null) => (header ?? "").split(";")[0]!.trim().toLowerCase();

/**
 * Why a POST to a page must be refused before the framework decodes it as a server action, or
 * null. A call from our pages (`Next-Action` header) sends React's encoding of the arguments as
 * text or as multipart form data; a form posted without scripts sends multipart form data.
 */
export async function actionRequestRefusal(req: Request): Promise<EdgeRefusal | null> {
  if (req.method.toUpperCase() !== "POST") return null;
  const type = mediaType(req.headers.get("content-type"));
  const isCall = req.headers.has("next-action");
  if (type === "multipart/form-data") {
    let form: FormData;
    try {
      form = await req.formData();
    } catch {
      return refusal(400, "bad_action", "The form data of this request cannot be read");
    }
    const problem = isCall ? modelProblem(form, "", "list") : formActionProblem(form);
    return problem ? refusal(400, "bad_action", problem) : null;
  }
  if (!isCall) return null; // a plain POST to a page is no action: the page is drawn as for a GET
  if (type !== "text/plain")
    return refusal(
      415,
      "unsupported_type",
      "A server action takes its arguments as text/plain or multipart/form-data",
    );
  let text: string;
  try {
    text = await req.text();
  } catch {
    return refusal(400, "bad_action", "The body of this request cannot be read");
  }
  const form = new FormData();
  form.set("0", text);
  const problem = modelProblem(form, "", "list");
  return problem ? refusal(400, "bad_action", problem) : null;
}

/** A form posted without scripts: its bound arguments (`$ACTION_<n>:<k>`) must decode too. */
function formActionProblem(form: FormData): string | null {
  const prefixes = new Set<string>();
  for (const key of form.keys()) {
    const m = /^(\$ACTION_\d+:)\d+$/.exec(key);
    if (m) prefixes.add(m[1]!);
  }
  for (const prefix of prefixes) {
    const problem = modelProblem(form, prefix, "record");
    if (problem) return problem;
  }
  return null;
}

/** Markers React decodes from a string without looking at another part of the body. */
const PLAIN_MARKERS = new Set(["$", "K", "T", "I", "-", "N", "u", "H", "D"]);
/** Markers naming another part by id (`$@1`, `$Q2`, `$3:a:0`); the part must be there. */
const PART_MARKERS = new Set(["@", "Q", "W", "i"]);
/** Server references, streams and typed arrays: never sent by our pages. */
const REFUSED_MARKERS = new Set("hAOoUSsLlGgMmVRrXx".split(""));
const MAX_BIGINT_DIGITS = 300;

/**
 * Why the arguments (React's reply encoding: JSON parts named `<prefix><n>`, part 0 the root,
 * strings starting with `$` marking references) cannot be decoded, or null. Our pages only ever
 * send plain values, dates, form data and references between parts; anything else (server
 * references, streams, typed arrays) is refused.
 */
function modelProblem(form: FormData, prefix: string, root: "list" | "record"): string | null {
  const parts = new Map<number, unknown>();
  for (const [key, value] of form) {
    if (!key.startsWith(prefix)) continue;
    const id = key.slice(prefix.length);
    if (!/^\d+$/.test(id)) continue;
    if (typeof value !== "string") return "A part of the action's arguments is not text";
    try {
      parts.set(Number(id), JSON.parse(value));
    } catch {
      return "The action's arguments are not valid JSON";
    }
  }
  if (!parts.has(0)) return "The action's arguments are missing";
  const top = parts.get(0);
  if (root === "list" ? !Array.isArray(top) : !top || typeof top !== "object" || Array.isArray(top))
    return "The action's arguments are not a list";
  for (const root of parts.values()) {
    const stack: unknown[] = [root];
    while (stack.length) {
      const v = stack.pop();
      if (typeof v === "string") {
        const problem = referenceProblem(v, parts, form, prefix);
        if (problem) return problem;
      } else if (Array.isArray(v)) stack.push(...v);
      else if (v && typeof v === "object") stack.push(...Object.values(v));
    }
  }
  return null;
}

function referenceProblem(
  s: string,
  parts: Map<number, unknown>,
  form: FormData,
  prefix: string,
): string | null {
  if (s[0] !== "$") return null;
  const marker = s[1];
  const bad = "The action's arguments refer to something that is not there";
  if (marker === undefined) return bad;
  if (PLAIN_MARKERS.has(marker)) return null;
  if (REFUSED_MARKERS.has(marker))
    return "The action's arguments carry a kind of value it does not take";
  if (marker === "n")
    return new RegExp(`^\\$n-?\\d{1,${MAX_BIGINT_DIGITS}}$`).test(s)
      ? null
      : "The action's arguments carry a number that is not one";
  if (marker === "B") {
    const id = hexId(s.slice(2));
    return id !== null && form.get(`${prefix}${id}`) instanceof Blob ? null : bad;
  }
  const path = (PART_MARKERS.has(marker) ? s.slice(2) : s.slice(1)).split(":");
  const id = hexId(path[0]!);
  if (id === null || !parts.has(id)) return bad;
  let at: unknown = parts.get(id);
  for (const key of path.slice(1)) {
    if (!at || typeof at !== "object" || !Object.prototype.hasOwnProperty.call(at, key)) return bad;
    at = (at as Record<string, unknown>)[key];
  }
  if ((marker === "Q" || marker === "W" || marker === "i") && !Array.isArray(at)) return bad;
  if (marker === "Q" && !(at as unknown[]).every((e) => Array.isArray(e) && e.length === 2))
    return bad;
  return null;
}

/** A part id as React writes it (hexadecimal); null when it is none. */
function hexId(text: string): number | null {
  return /^[0-9a-f]{1,8}$/i.test(text) ? parseInt(text, 16) : null;
}
