import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";

import { describe, expect, it } from "vitest";

const dir = join(process.cwd(), "lib/calc");
const modules = [
  ...readdirSync(dir).filter((f) => f.endsWith(".ts")),
  ...readdirSync(join(dir, "_lib")).map((f) => `_lib/${f}`),
  ...readdirSync(join(dir, "sizing")).map((f) => `sizing/${f}`),
];

describe("docs/calculations.md is the library's reference", () => {
  const doc = readFileSync(join(process.cwd(), "docs/calculations.md"), "utf8");
  it.each(modules)("%s points to its section near its top", (f) => {
    const head = readFileSync(join(dir, f), "utf8").split("\n").slice(0, 20).join("\n");
    const m =
      /docs\/calculations\.md (§\d+)/.exec(head) ??
      /docs\/calculations\.md \(all sections\)/.exec(head);
    expect(m).not.toBeNull();
    if (m && m[1]) expect(doc).toContain(`## ${m[1]} `);
  });
});
