import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";

import { describe, expect, it } from "vitest";

import { axisTick } from "@/components/charts/axis-ticks";

/**
 * Recharts draws a tick's text with its <Text>, which splits the text into words at ordinary
 * spaces and, when the axis gives the tick a width, puts each word in a <tspan> line of its own:
 * "20 gal/h" became <tspan>20</tspan><tspan>gal/h</tspan>, read as "20gal/h". Its word breaks
 * (node_modules/recharts/lib/component/Text.js, BREAKING_SPACES) leave out the no-break space.
 */
const RECHARTS_BREAKING_SPACES = /[ \f\n\r\t\v\u2028\u2029]+/;

function walk(dir: string, out: string[] = []): string[] {
  for (const f of readdirSync(dir)) {
    const p = join(dir, f);
    if (statSync(p).isDirectory()) walk(p, out);
    else if (f.endsWith(".tsx")) out.push(p);
  }
  return out;
}

describe("chart ticks keep the number and its unit together", () => {
  it("the tick formatter joins them with a space recharts does not break at", () => {
    for (const unit of ["gal/h", "L/h", "psi", "kPa", "rpm", "%"]) {
      const text = axisTick(unit)(20);
      expect(text.split(RECHARTS_BREAKING_SPACES)).toEqual([text]);
      expect(text.replace(/\s/g, " ")).toBe(`20 ${unit}`);
    }
    expect(axisTick("")(20)).toBe("20");
  });

  it("the build sheet's charts are plain SVG: no charting library in components/builds or components/charts", () => {
    const files = ["components/builds", "components/charts"].flatMap((d) => walk(d));
    expect(files).toContain(join("components", "charts", "line-plot.tsx"));
    for (const f of files) expect(readFileSync(f, "utf8"), f).not.toMatch(/from "recharts"/);
  });

  it("no axis passes recharts' own `unit` prop (it appends the unit after an ordinary space)", () => {
    const charts = ["app", "components"]
      .flatMap((d) => walk(d))
      .filter((f) => readFileSync(f, "utf8").includes('from "recharts"'));
    expect(charts.length).toBeGreaterThan(1);
    for (const f of charts) {
      const axes = readFileSync(f, "utf8").match(/<[XYZ]Axis\b[^>]*>/g) ?? [];
      expect(
        axes.filter((a) => /\bunit=/.test(a)),
        f,
      ).toEqual([]);
    }
  });
});
