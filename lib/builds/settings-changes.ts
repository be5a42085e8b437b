import { diffInputs, type InputChange } from "@/lib/builds/diff";
import { readStoredInputs, storedSizingSettings } from "@/lib/builds/stored-inputs";
import type { UnitSystem } from "@/lib/calc";
import { effectiveInputs, type SizingSettings } from "@/lib/sizing/effective-inputs";

/**
 * What today's shop settings change in what a stored build sizes, setting by setting in the
 * reader's units: none when it was sized with settings that size it the same. The build sheet
 * and the kit both say so (components/builds/settings-changed-note.tsx).
 */
export function settingsChangesOf(
  row: { inputs: unknown; inputsSchemaVersion: number; sizingSettings: unknown },
  today: SizingSettings,
  units: UnitSystem,
): InputChange[] {
  const inputs = readStoredInputs(row);
  return diffInputs(
    effectiveInputs(storedSizingSettings(row), inputs),
    effectiveInputs(today, inputs),
    units,
  );
}
