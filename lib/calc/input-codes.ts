// Reference: docs/calculations.md §8.
/**
 * The codes the sizing's inputs take, apart from the schema (lib/calc/schema.ts re-exports them),
 * so that labels and the registry can name them without loading the validation library.
 */

export const ASPIRATIONS = ["na", "turbo", "supercharged"] as const;
/** How the power reaches the wheels; a shop keeps a drivetrain loss for each. */
export const DRIVE_TYPES = ["manual", "automatic", "awd"] as const;
export const REGULATOR_TYPES = ["boost-referenced", "fixed"] as const;
