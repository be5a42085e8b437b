import type { FuelSystemResult, ParsedFuelSystemInput, UnitSystem } from "@/lib/calc";
import { BSFC_SOURCE_LABELS, DRIVE_TYPE_LABELS } from "@/lib/calc/code-labels";
import { formatValue } from "@/lib/calc/quantities";

/**
 * The settings behind the figures beside it: limits, drivetrain loss and fuel properties as the
 * sizing used them (the build's own where it states them, else the shop's, else the library's),
 * each in the reader's units through the registry.
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
  const pct = (x: number) => formatValue("percent", x, units, 0);
  const rich = result.blend.rich;
  const props = input.fuel.properties;
  const blend = formatValue("ethanol", rich.ethanolVolPct, units);
  const loss = input.target.drivetrainLossPct;
  return (
    <p className="mt-3 text-sm text-ink-600" data-testid="sizing-settings">
      Sized for {pct(l.designDutyPct)} injector duty (caution above {pct(l.dutyCautionPct)}, danger
      above {pct(l.dutyDangerPct)}), a pump margin of at least {pct(l.minPumpMarginPct)} and line
      drops of at most {formatValue("pressure", l.maxLineDropKpa, units)};{" "}
      {input.target.measuredAt === "wheel"
        ? `${loss === undefined ? "—" : pct(loss)} drivetrain loss (${DRIVE_TYPE_LABELS[input.target.driveType ?? "manual"].toLowerCase()}); `
        : ""}
      BSFC {formatValue("bsfc", rich.bsfcGPerKwh, units)} at {blend} (
      {BSFC_SOURCE_LABELS[rich.bsfcSource]}); {blend} density{" "}
      {formatValue("density", rich.densityKgPerL, units)}
      {props?.gasoline || props?.ethanol ? " (the shop's fuel properties)" : ""}.
    </p>
  );
}
