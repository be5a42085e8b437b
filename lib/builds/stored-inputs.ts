import {
  CALC_VERSION,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
} from "@/lib/calc";
import { Unavailable } from "@/lib/domain/errors";

/**
 * The format of the sizing inputs kept on builds and revisions (`inputs_schema_version`). Raise it
 * when FuelSystemInputSchema changes so that stored inputs no longer parse, and add the step from
 * the previous version to UPGRADES.
 */
export const INPUTS_SCHEMA_VERSION = 1;

/**
 * One step per stored format: turns inputs kept at that version into today's inputs. Version 1 is
 * today's schema. A later format adds `2: (raw) => FuelSystemInputSchema.parse(upgrade1to2(raw))`
 * and so on, so every stored version reaches today's shape.
 */
const UPGRADES: Record<number, (raw: unknown) => ParsedFuelSystemInput> = {
  1: (raw) => FuelSystemInputSchema.parse(raw),
};

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
  inputs: ParsedFuelSystemInput;
  inputsSchemaVersion: number;
  result: FuelSystemResult;
  calcVersion: string;
}

/** Validates and sizes inputs on the server — the same library the browser ran. */
export function sizeForSave(inputs: FuelSystemInput): SizedInputs {
  const parsed = FuelSystemInputSchema.parse(inputs);
  return {
    inputs: parsed,
    inputsSchemaVersion: INPUTS_SCHEMA_VERSION,
    result: sizeParsedFuelSystem(parsed),
    calcVersion: CALC_VERSION,
  };
}
