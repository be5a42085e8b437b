import {
  BSFC_SOURCE_LABELS,
  converter,
  toShown,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

const DRIVE = { manual: "manual", automatic: "automatic", awd: "all-wheel drive" } as const;

/**
 * The settings behind the figures beside it: limits, drivetrain loss and fuel properties as the
 * sizing used them (the build's own where it states them, else the shop's, else the library's).
 */
export function SizingSettingsNote({
  input,
  result,
  units,
}: {
  input: ParsedFuelSystemInput;
  result: FuelSystemResult;
  units: UnitSystem;
}) {
  const l = result.limits;
  const p = converter("pressure", units);
  const rich = result.blend.rich;
  const props = input.fuel.properties;
  return (
    <p className="mt-3 text-sm text-ink-600" data-testid="sizing-settings">
      Sized for {l.designDutyPct} % injector duty (caution above {l.dutyCautionPct} %, danger above{" "}
      {l.dutyDangerPct} %), a pump margin of at least {l.minPumpMarginPct} % and line drops of at
      most {toShown("pressure", l.maxLineDropKpa, units)} {p.unit};{" "}
      {input.target.measuredAt === "wheel"
        ? `${input.target.drivetrainLossPct ?? "—"} % drivetrain loss (${DRIVE[input.target.driveType ?? "manual"]}); `
        : ""}
      BSFC {toShown("bsfc", rich.bsfcGPerKwh, units)} {converter("bsfc", units).unit} at E
      {rich.ethanolVolPct} ({BSFC_SOURCE_LABELS[rich.bsfcSource]}); E{rich.ethanolVolPct} density{" "}
      {rich.densityKgPerL.toFixed(3)} kg/L
      {props?.gasoline || props?.ethanol ? " (the shop's fuel properties)" : ""}.
    </p>
  );
}
