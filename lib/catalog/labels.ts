import { REGULATOR_LABELS } from "@/lib/calc/code-labels";
import { formatValue } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";
import type { PartCategory } from "@/lib/domain/parts";

/** One line of a part's key figures for tables, in the reader's unit system (specs are canonical). */
export function specSummary(
  category: PartCategory,
  s: Record<string, unknown>,
  units: UnitSystem = "metric",
): string {
  const v = (q: Parameters<typeof formatValue>[0], x: unknown) =>
    typeof x === "number" ? formatValue(q, x, units) : "—";
  const e = s.ethanolOk === true ? " · E85 ok" : s.ethanolOk === false ? " · not for ethanol" : "";
  switch (category) {
    case "injector":
      return `${v("injectorFlow", s.ratedFlowCcPerMin)} @ ${v("pressure", s.ratedPressureKpa)}${s.minPulseWidthMs ? ` · min ${v("time", s.minPulseWidthMs)}` : ""}${e}`;
    case "pump": {
      const c = (
        s.curves as
          { voltage: number; points: { pressureKpa: number; flowLPerH: number }[] }[] | undefined
      )?.[0];
      const p = c?.points.find((x) => x.pressureKpa === 300) ?? c?.points[0];
      return `${p ? `${v("volumeFlow", p.flowLPerH)} @ ${v("pressure", p.pressureKpa)}, ${v("voltage", c!.voltage)}` : ""} · ${s.mounting}${e}`;
    }
    case "regulator":
      return `${REGULATOR_LABELS[s.type as keyof typeof REGULATOR_LABELS] ?? s.type} · ${v("pressure", s.minPressureKpa)} to ${v("pressure", s.maxPressureKpa)}`;
    case "line":
      return `${v("anDash", s.dash)} · ${v("diameter", s.insideDiameterMm)} ID${s.material ? ` · ${s.material}` : ""}${e}`;
    case "filter":
      return `${v("filterRating", s.micron)} · ${v("pressureDrop", s.dropKpa)} drop${e}`;
    case "fitting":
      return typeof s.dash === "number" ? v("anDash", s.dash) : "";
    case "sensor":
      return "ethanol content";
    default:
      return "";
  }
}
