import type { PartCategory } from "@/lib/domain/parts";

/** One line of a part's key figures for tables (canonical units). */
export function specSummary(category: PartCategory, s: Record<string, unknown>): string {
  const e = s.ethanolOk === true ? " · E85 ok" : s.ethanolOk === false ? " · not for ethanol" : "";
  switch (category) {
    case "injector":
      return `${s.ratedFlowCcPerMin} cc/min @ ${s.ratedPressureKpa} kPa${s.minPulseWidthMs ? ` · min ${s.minPulseWidthMs} ms` : ""}${e}`;
    case "pump": {
      const c = (
        s.curves as
          { voltage: number; points: { pressureKpa: number; flowLPerH: number }[] }[] | undefined
      )?.[0];
      const p = c?.points.find((x) => x.pressureKpa === 300) ?? c?.points[0];
      return `${p ? `${p.flowLPerH} L/h @ ${p.pressureKpa} kPa, ${c!.voltage} V` : ""} · ${s.mounting}${e}`;
    }
    case "regulator":
      return `${s.type} · ${s.minPressureKpa}–${s.maxPressureKpa} kPa`;
    case "line":
      return `−${s.dash} AN · ${s.insideDiameterMm} mm ID${s.material ? ` · ${s.material}` : ""}${e}`;
    case "filter":
      return `${s.micron} µm · ${s.dropKpa} kPa drop${e}`;
    case "fitting":
      return s.dash ? `−${s.dash} AN` : "";
    case "sensor":
      return "ethanol content";
    default:
      return "";
  }
}

//END
