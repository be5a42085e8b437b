import { z } from "zod";

/**
 * Inputs made from a zod schema itself (through `z.toJSONSchema`): for every field it describes,
 * the values at and just past its edges — the longest string it takes and one longer, the
 * largest and smallest numbers and the next ones out, whole-number limits of the database's
 * `integer`, unicode that is hard to store (astral, right-to-left, combining, lone surrogates),
 * control characters and NUL, dates of year 0 and 10000 — each put into an otherwise valid body.
 * Deterministic for a seed.
 */

type Json = Record<string, unknown>;
interface Node extends Json {
  type?: string | string[];
  properties?: Record<string, Node>;
  required?: string[];
  items?: Node;
  anyOf?: Node[];
  oneOf?: Node[];
  enum?: unknown[];
  const?: unknown;
  format?: string;
  pattern?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minItems?: number;
  maxItems?: number;
  default?: unknown;
}

export type Path = (string | number)[];
export interface Leaf {
  path: Path;
  node: Node;
}
export interface Case {
  /** The field the edge value went into ([] for the body as a whole). */
  path: Path;
  value: unknown;
  /** What kind of edge this is, for the failure message. */
  label: string;
}

/** The JSON Schema of what a zod schema takes as input (refinements and transforms left out). */
export function jsonSchemaOf(schema: z.ZodType): Node {
  return z.toJSONSchema(schema, { io: "input", unrepresentable: "any" }) as Node;
}

/** A small deterministic random source (mulberry32). */
export function rng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!,
    shuffle: <T>(xs: T[]): T[] => {
      const out = [...xs];
      for (let i = out.length - 1; i > 0; i--) {
        const j = Math.floor(next() * (i + 1));
        [out[i], out[j]] = [out[j]!, out[i]!];
      }
      return out;
    },
    uuid: () => {
      const hex = Array.from({ length: 32 }, () => Math.floor(next() * 16).toString(16)).join("");
      return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-4${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
    },
  };
}
export type Rng = ReturnType<typeof rng>;

const typeOf = (n: Node): string | undefined =>
  Array.isArray(n.type) ? n.type.find((t) => t !== "null") : n.type;
const options = (n: Node): Node[] | undefined => n.anyOf ?? n.oneOf;

/** Every field the schema describes (arrays through their first item), depth first. */
export function leaves(node: Node, path: Path = []): Leaf[] {
  const out: Leaf[] = [{ path, node }];
  const opts = options(node);
  if (opts) {
    for (const o of opts)
      for (const l of leaves(o, path)) if (l.path.length > path.length) out.push(l);
    return dedupe(out);
  }
  if (typeOf(node) === "object" && node.properties)
    for (const [k, child] of Object.entries(node.properties))
      out.push(...leaves(child, [...path, k]));
  if (typeOf(node) === "array" && node.items) out.push(...leaves(node.items, [...path, 0]));
  return out;
}
function dedupe(ls: Leaf[]): Leaf[] {
  const seen = new Set<string>();
  return ls.filter((l) => {
    const k = JSON.stringify(l.path);
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

export const NIL_UUID = "00000000-0000-0000-0000-000000000000";
export const MAX_UUID = "ffffffff-ffff-ffff-ffff-ffffffffffff";

/** A value the node takes (its default, first option, lower bounds, shortest text). */
export function sample(node: Node, r: Rng): unknown {
  if (node.const !== undefined) return node.const;
  if (node.default !== undefined) return node.default;
  if (node.enum) return node.enum[0];
  const opts = options(node);
  if (opts) return sample(opts.find((o) => typeOf(o) !== "null") ?? opts[0]!, r);
  switch (typeOf(node)) {
    case "object": {
      const out: Json = {};
      for (const k of node.required ?? []) out[k] = sample(node.properties![k]!, r);
      return out;
    }
    case "array":
      return Array.from({ length: node.minItems ?? 0 }, () => sample(node.items ?? {}, r));
    case "integer":
    case "number":
      return node.minimum ?? (node.exclusiveMinimum !== undefined ? node.exclusiveMinimum + 1 : 1);
    case "boolean":
      return false;
    case "string":
      if (node.format === "uuid") return r.uuid();
      if (node.format === "date") return "2099-01-31";
      if (node.format === "email") return "edge@example.test";
      return "x".repeat(Math.max(node.minLength ?? 1, 1));
    default:
      return "x";
  }
}

/** Text that is hard to store, show or compare: none of it is a person's mistake to refuse with a 500. */
const HARD_TEXT = [
  "😀🚗💨",
  "𝕏𝕪𝕫 astral",
  "\u202eevil right-to-left override",
  "שלום · مرحبا", // right-to-left scripts
  "e\u0301\u0301\u0301 combining",
  "\ufeffbyte order mark",
  "zero\u200bwidth\u200djoiner",
  "line\r\nbreak\ttab",
  "\u0085 next line, \u009b CSI",
  "<script>alert(1)</script>",
  "' or 1=1 --",
  "%00%zz",
  '=HYPERLINK("https://example.test","x")',
  "１２３ fullwidth digits",
];
/** Control characters and NUL (the edge refuses them, naming the field). */
const CONTROL_TEXT = ["\u0000", "a\u0000b", "\u0007 bell", "\u001b[31mred", "\u007f delete", "\b"];
/** Lone surrogates: not Unicode at all (JSON can carry them, PostgreSQL cannot). */
const BROKEN_TEXT = ["\ud800", "x\udfffy"];
/** Numbers written as text (forms and CSV carry every number so). */
const NUMBER_TEXT = [
  "21474836.47",
  "21474836.48",
  "2147483647",
  "2147483648",
  "9999999",
  "99999999999999999999",
  "-1",
  "-0",
  "0",
  "0.0005",
  "1e309",
  "-1e309",
  "NaN",
  "Infinity",
  "1,5",
  " 12 ",
];
/** Dates PostgreSQL or JavaScript cannot hold, or that do not exist. */
export const DATE_TEXT = [
  "0000-01-01",
  "0000-00-00",
  "0001-01-01",
  "1899-12-31",
  "1900-01-01",
  "9999-12-31",
  "10000-01-01",
  "+010000-01-01",
  "-000001-01-01",
  "2023-02-29",
  "2024-02-29",
  "2024-13-01",
  "2024-01-01T00:00:00Z",
];

function stringEdges(n: Node, r: Rng): [unknown, string][] {
  const out: [unknown, string][] = [];
  const max = n.maxLength;
  const min = n.minLength ?? 0;
  if (n.format === "uuid")
    out.push(
      [r.uuid(), "unknown uuid"],
      [NIL_UUID, "nil uuid"],
      [MAX_UUID, "max uuid"],
      [r.uuid().toUpperCase(), "upper-case uuid"],
      [`${r.uuid()}0`, "uuid too long"],
      ["not-a-uuid", "no uuid"],
    );
  if (n.format === "date") for (const d of DATE_TEXT) out.push([d, `date ${d}`]);
  if (n.format === "email")
    out.push(
      [`${"a".repeat(64)}@${"b".repeat(63)}.example.test`, "long e-mail"],
      ["ünïcödé@exämple.test", "unicode e-mail"],
      ["😀@example.test", "emoji e-mail"],
      ["a@b", "e-mail without a dot"],
    );
  for (const t of HARD_TEXT) out.push([t, "hard text"]);
  for (const t of CONTROL_TEXT) out.push([t, "control character"]);
  for (const t of BROKEN_TEXT) out.push([t, "lone surrogate"]);
  for (const t of NUMBER_TEXT) out.push([t, "number as text"]);
  out.push(["", "empty"], ["   ", "blank"]);
  if (max !== undefined) {
    out.push(["x".repeat(max), "longest"]);
    out.push(["😀".repeat(Math.floor(max / 2)), "longest, in emoji"]);
    out.push([`${"ש".repeat(max - 1)}\u202e`, "longest, right-to-left"]);
    out.push(["x".repeat(max + 1), "one too long"]);
  } else {
    out.push(
      ["x".repeat(10_000), "10 000 characters"],
      ["😀".repeat(50_000), "100 000 units of emoji"],
    );
  }
  if (min > 1) out.push(["x".repeat(min), "shortest"], ["x".repeat(min - 1), "one too short"]);
  if (n.enum) {
    for (const e of n.enum) out.push([e, "an option"]);
    out.push([`${String(n.enum[0])}\u0000`, "option with NUL"], ["NOT-AN-OPTION", "no option"]);
  }
  return out;
}

function numberEdges(n: Node): [unknown, string][] {
  const int = typeOf(n) === "integer";
  const lo = n.minimum ?? n.exclusiveMinimum;
  const hi = n.maximum ?? n.exclusiveMaximum;
  const out: [unknown, string][] = [];
  const step = (x: number) => (int ? 1 : Math.max(Math.abs(x) * 1e-12, 1e-9));
  if (lo !== undefined) out.push([lo, "minimum"], [lo - step(lo), "just below the minimum"]);
  if (hi !== undefined) out.push([hi, "maximum"], [hi + step(hi), "just above the maximum"]);
  if (lo !== undefined && hi !== undefined && int)
    out.push([Math.floor((lo + hi) / 2) + 0.5, "a fraction"]);
  out.push(
    [0, "zero"],
    [-0, "negative zero"],
    [-1, "minus one"],
    [2 ** 31 - 1, "int4 max"],
    [2 ** 31, "int4 max + 1"],
    [-(2 ** 31) - 1, "int4 min - 1"],
    [2 ** 53 + 2, "past safe integers"],
    [Number.MAX_VALUE, "largest double"],
    [-Number.MAX_VALUE, "most negative double"],
    [Number.MIN_VALUE, "smallest double"],
    [1e-7, "tiny"],
  );
  // The same limits written as text, as a form sends them.
  if (hi !== undefined)
    out.push([String(hi), "maximum as text"], [`${hi}1`, "past maximum as text"]);
  out.push(["1e309", "overflow as text"]);
  return out;
}

function arrayEdges(n: Node, base: unknown, r: Rng): [unknown, string][] {
  const item = Array.isArray(base) && base.length ? base[0] : sample(n.items ?? {}, r);
  const out: [unknown, string][] = [[[], "empty list"]];
  if (n.maxItems !== undefined) {
    out.push([Array.from({ length: n.maxItems }, () => structuredClone(item)), "longest list"]);
    out.push([
      Array.from({ length: n.maxItems + 1 }, () => structuredClone(item)),
      "one item too many",
    ]);
  } else out.push([Array.from({ length: 2000 }, () => structuredClone(item)), "2000 items"]);
  out.push(["not a list", "text for a list"]);
  return out;
}

/** The edge values of one field. */
export function edgesOf(n: Node, base: unknown, r: Rng): [unknown, string][] {
  const opts = options(n);
  if (opts) {
    const out: [unknown, string][] = [];
    for (const o of opts) out.push(...edgesOf(o, base, r));
    return out;
  }
  if (n.const !== undefined)
    return [
      [n.const, "the constant"],
      ["x", "not the constant"],
    ];
  switch (typeOf(n)) {
    case "string":
      return stringEdges(n, r);
    case "integer":
    case "number":
      return numberEdges(n);
    case "boolean":
      return [
        [true, "true"],
        [false, "false"],
        ["true", "true as text"],
        [1, "one for a boolean"],
      ];
    case "array":
      return arrayEdges(n, base, r);
    case "object":
      return [
        [{}, "empty object"],
        [null, "null object"],
        [[], "list for an object"],
      ];
    case "null":
      return [[null, "null"]];
    default:
      return [
        ...stringEdges({ type: "string" }, r).filter(() => r.next() < 0.3),
        ...numberEdges({ type: "number" }).filter(() => r.next() < 0.3),
      ];
  }
}

/** A copy of `base` with `value` at `path` (missing objects and lists on the way made from the schema). */
export function setAt(base: unknown, root: Node, path: Path, value: unknown, r: Rng): unknown {
  if (path.length === 0) return value;
  const copy = structuredClone(base ?? sample(root, r)) as Json;
  let at: Json = copy;
  let node: Node | undefined = root;
  for (const [i, key] of path.entries()) {
    node = childOf(node, key);
    if (i === path.length - 1) {
      at[key as string] = value;
      break;
    }
    let next = at[key as string];
    if (!next || typeof next !== "object") {
      next = node ? sample(node, r) : {};
      if (Array.isArray(next) && next.length === 0 && node?.items) next = [sample(node.items, r)];
      at[key as string] = next;
    }
    if (Array.isArray(next) && next.length === 0)
      (next as unknown[]).push(node?.items ? sample(node.items, r) : {});
    at = next as Json;
  }
  return copy;
}
function childOf(n: Node | undefined, key: string | number): Node | undefined {
  if (!n) return undefined;
  const opts = options(n);
  if (opts) {
    for (const o of opts) {
      const c = childOf(o, key);
      if (c) return c;
    }
    return undefined;
  }
  return typeof key === "number" ? n.items : n.properties?.[key];
}

/** Read a path of a value (undefined when it is not there). */
export function getAt(v: unknown, path: Path): unknown {
  let at = v;
  for (const k of path) at = at && typeof at === "object" ? (at as Json)[k as string] : undefined;
  return at;
}

/**
 * `count` cases for a schema around a valid `base`: a field and one of its edge values each,
 * chosen evenly over the fields (every field before any field twice), in a seeded order.
 */
export function casesFor(
  schema: z.ZodType,
  base: unknown,
  count: number,
  r: Rng,
  skip: (path: Path) => boolean = () => false,
): Case[] {
  const root = jsonSchemaOf(schema);
  const fields = r.shuffle(leaves(root).filter((l) => l.path.length > 0 && !skip(l.path)));
  const pools = fields.map((l, i) => ({
    leaf: l,
    values: interleaved(r.shuffle(edgesOf(l.node, getAt(base, l.path), r)), r, i),
  }));
  const out: Case[] = [];
  for (let round = 0; out.length < count && pools.some((p) => p.values.length > round); round++)
    for (const p of pools) {
      if (out.length >= count) break;
      const v = p.values[round];
      if (v) out.push({ path: p.leaf.path, value: v[0], label: v[1] });
    }
  return out;
}

/**
 * The kinds of edge most likely to reach storage wrongly: first for every field (each field
 * starting at another one, so a schema of many fields still sees them all).
 */
const FIRST = [
  "control character",
  "lone surrogate",
  "one too long",
  "just above the maximum",
  "longest, in emoji",
  "int4 max + 1",
  "just below the minimum",
  "longest, right-to-left",
  "past maximum as text",
  "number as text",
];

/** One value of each kind of edge before a second of any, the likeliest kinds first. */
function interleaved(values: [unknown, string][], r: Rng, offset: number): [unknown, string][] {
  const groups = new Map<string, [unknown, string][]>();
  for (const v of values) groups.set(v[1], [...(groups.get(v[1]) ?? []), v]);
  const first = [...FIRST.slice(offset % FIRST.length), ...FIRST.slice(0, offset % FIRST.length)]
    .filter((k) => groups.has(k))
    .map((k) => groups.get(k)!);
  const rest = r.shuffle(
    [...groups.entries()].filter(([k]) => !FIRST.includes(k)).map(([, g]) => g),
  );
  const order = [...first, ...rest];
  const out: [unknown, string][] = [];
  for (let i = 0; out.length < values.length; i++) for (const g of order) if (g[i]) out.push(g[i]!);
  return out;
}

/** The body of a case: the base with its edge value in place. */
export function bodyOf(schema: z.ZodType, base: unknown, c: Case, r: Rng): unknown {
  return setAt(base, jsonSchemaOf(schema), c.path, c.value, r);
}

/** A text field a person types freely (no options, format or pattern to meet). */
const freeText = (n: Node) =>
  typeOf(n) === "string" && !n.enum && !n.format && !n.pattern && n.const === undefined;
const numeric = (n: Node) => typeOf(n) === "number" || typeOf(n) === "integer";

/**
 * Whole-body cases: every field of a kind at the same edge at once — each free-text field at
 * its longest (in ASCII, in emoji, right to left), with a lone surrogate; each number at its
 * maximum, at its minimum; each list at its longest. Valid at the edges (but the surrogate), so
 * they reach the database: what the columns must hold.
 */
export function sweepsFor(schema: z.ZodType, base: unknown, r: Rng): Case[] {
  const root = jsonSchemaOf(schema);
  const all = leaves(root).filter((l) => l.path.length > 0 && !l.path.includes("id"));
  const sweep = (
    label: string,
    pick: (n: Node) => boolean,
    value: (n: Node, at: unknown) => unknown,
  ) => {
    let body = structuredClone(base);
    let touched = 0;
    for (const l of all) {
      if (!pick(l.node)) continue;
      const v = value(l.node, getAt(body, l.path));
      if (v === undefined) continue;
      body = setAt(body, root, l.path, v, r);
      touched++;
    }
    return touched ? [{ path: [] as Path, value: body, label }] : [];
  };
  return [
    ...sweep(
      "every text at its longest",
      (n) => freeText(n) && n.maxLength !== undefined,
      (n) => "x".repeat(n.maxLength!),
    ),
    ...sweep(
      "every text at its longest, in emoji",
      (n) => freeText(n) && n.maxLength !== undefined,
      (n) => "😀".repeat(Math.floor(n.maxLength! / 2)),
    ),
    ...sweep("every text right to left and combining", freeText, (n) =>
      `\u202eשל\u0301ום ${"ع".repeat(Math.max(0, Math.min(n.maxLength ?? 40, 40) - 6))}`.slice(
        0,
        Math.max(n.maxLength ?? 40, n.minLength ?? 1),
      ),
    ),
    ...sweep("every text with a lone surrogate", freeText, () => "x\ud800"),
    ...sweep(
      "every number at its maximum",
      (n) => numeric(n) && n.maximum !== undefined,
      (n) => n.maximum,
    ),
    ...sweep(
      "every number at its minimum",
      (n) => numeric(n) && n.minimum !== undefined,
      (n) => n.minimum,
    ),
    ...sweep(
      "every list at its longest",
      (n) => typeOf(n) === "array" && n.maxItems !== undefined,
      (n, at) =>
        Array.isArray(at) && at.length
          ? Array.from({ length: n.maxItems! }, () => structuredClone(at[0]))
          : undefined,
    ),
  ];
}
