import { readFileSync } from "node:fs";
import { createRequire } from "node:module";

import type { Page } from "playwright-core";

const require = createRequire(import.meta.url);
const AXE = readFileSync(require.resolve("axe-core/axe.min.js"), "utf8");

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

/** axe-core (WCAG 2.0/2.1 A and AA rules) on the page as it stands; serious and critical findings. */
export async function seriousViolations(page: Page): Promise<string[]> {
  await page.evaluate(AXE); // through the debugging protocol: the page's CSP does not apply to it
  const found = (await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: unknown[] }> };
      }
    ).axe;
    return (
      await axe.run(document, {
        runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"] },
      })
    ).violations;
  })) as Violation[];
  return found
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(" "))
          .join(", ")}`,
    );
}

/** Collects Content-Security-Policy violations the page reports (none expected). */
export function cspWatch(page: Page) {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy/i.test(m.text())) seen.push(m.text().slice(0, 200));
  });
  return seen;
}
