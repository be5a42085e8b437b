import {
  CALC_VERSION,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
} from "@/lib/calc";
import { Unavailable } from "@/lib/domain/errors";
import {
  parsedEffectiveInputs,
  readSizingSettings,
  type SizingSettings,
} from "@/lib/sizing/effective-inputs";

/**
 * The format of the sizing inputs kept on builds and revisions (`inputs_schema_version`). Raise it
 * when FuelSystemInputSchema changes so that stored inputs no longer parse, and add the step from
 * the previous version to UPGRADES.
 */
export const INPUTS_SCHEMA_VERSION = 3;

/**
 * One step per stored format: turns inputs kept at that version into today's inputs. Version 2 is
 * today's schema. A later format adds `3: (raw) => FuelSystemInputSchema.parse(upgrade2to3(raw))`
 * and so on, so every stored version reaches today's shape.
 *
 * Version 3 keeps the pre- and post-pump filters as items (`filters`) instead of a filter drop on
 * each line.
 *
 * Version 1 always stated a drivetrain loss and, with `limits`, every limit (the schema filled in
 * defaults); version 2 leaves out what the build does not state, so the shop's settings apply
 * (lib/sizing/effective-inputs), and adds the drive type and fuel properties. Version 1 inputs
 * read as they are: what they stated stays stated, so an old build's figures do not move.
 */
const UPGRADES: Record<number, (raw: unknown) => ParsedFuelSystemInput> = {
  1: (raw) => FuelSystemInputSchema.parse(filtersOfFormat2(raw)),
  2: (raw) => FuelSystemInputSchema.parse(filtersOfFormat2(raw)),
  3: (raw) => FuelSystemInputSchema.parse(raw),
};

/**
 * Formats 1 and 2 kept one filter drop on each line (`lines.feed.filterDropKpa`, counted in the
 * pump's outlet pressure only with a feed line; the return line's was never used). Format 3
 * has the pre- and post-pump filters as items of their own (docs/calculations.md §4.5): the
 * feed line's drop becomes the post-pump filter, so an old build's figures do not move.
 */
function filtersOfFormat2(raw: unknown): unknown {
  if (!raw || typeof raw !== "object") return raw;
  const r = raw as {
    lines?: Record<string, Record<string, unknown> | undefined>;
    filters?: unknown;
  };
  if (!r.lines || typeof r.lines !== "object") return raw;
  const lines: Record<string, unknown> = {};
  for (const [side, line] of Object.entries(r.lines)) {
    if (line && typeof line === "object") {
      const { filterDropKpa, ...rest } = line;
      void filterDropKpa;
      lines[side] = rest;
    } else lines[side] = line;
  }
  const feedDrop = r.lines.feed?.filterDropKpa;
  return {
    ...r,
    lines,
    ...(typeof feedDrop === "number" && feedDrop > 0 && r.filters === undefined
      ? { filters: { postPumpDropKpa: feedDrop } }
      : {}),
  };
}

/** Inputs kept by this version of the product could not be read: a data problem, never the caller's. */
export class StoredInputsError extends Error {}

/**
 * A build's or revision's stored inputs in today's schema: the one way code reads them.
 *
 * @example readStoredInputs(row.build).injectors.count // 6
 * @throws Unavailable (503) when the row was written by a newer version of the product (during an
 *   update, an instance not yet updated meets it); StoredInputsError for a version it never wrote
 *   or inputs that do not parse.
 */
export function readStoredInputs(row: {
  inputs: unknown;
  inputsSchemaVersion: number;
}): ParsedFuelSystemInput {
  const v = row.inputsSchemaVersion;
  if (Number.isInteger(v) && v > INPUTS_SCHEMA_VERSION)
    throw new Unavailable(
      `This build was saved by a newer version of Fuelwright (inputs format ${v}; this server reads up to ${INPUTS_SCHEMA_VERSION}). Try again once the update is complete.`,
      "inputs_format_newer",
      "self",
    );
  const upgrade = UPGRADES[v];
  if (!upgrade) throw new StoredInputsError(`Stored inputs have an unknown format version (${v})`);
  try {
    return upgrade(row.inputs);
  } catch (e) {
    throw new StoredInputsError(`Stored inputs (format ${v}) do not parse`, { cause: e });
  }
}

/** What a save writes: the inputs validated, at today's format, and sized again on the server. */
export interface SizedInputs {
  /** The build's own inputs (what it states; the shop's settings fill the rest when sized). */
  inputs: ParsedFuelSystemInput;
  inputsSchemaVersion: number;
  result: FuelSystemResult;
  calcVersion: string;
  /** The shop settings it was sized with, kept beside the result so history never moves. */
  sizingSettings: SizingSettings;
}

/**
 * Validates and sizes inputs on the server with the given shop settings — the same library and
 * the same `effectiveInputs` the browser ran.
 */
export function sizeForSave(settings: SizingSettings, inputs: FuelSystemInput): SizedInputs {
  const parsed = FuelSystemInputSchema.parse(inputs);
  return {
    inputs: parsed,
    inputsSchemaVersion: INPUTS_SCHEMA_VERSION,
    result: sizeParsedFuelSystem(parsedEffectiveInputs(settings, parsed)),
    calcVersion: CALC_VERSION,
    sizingSettings: settings,
  };
}

/** The settings a build or revision was sized with (none stored: the library's defaults). */
export function storedSizingSettings(row: { sizingSettings: unknown }): SizingSettings {
  try {
    return readSizingSettings(row.sizingSettings);
  } catch (e) {
    throw new StoredInputsError("Stored sizing settings do not parse", { cause: e });
  }
}

/**
 * What a build or revision was sized with: its own inputs with the settings kept beside them —
 * the inputs to size it again exactly as it was (spec sheet, dyno comparison, verification).
 */
export function storedEffectiveInputs(row: {
  inputs: unknown;
  inputsSchemaVersion: number;
  sizingSettings: unknown;
}): ParsedFuelSystemInput {
  return parsedEffectiveInputs(storedSizingSettings(row), readStoredInputs(row));
}
