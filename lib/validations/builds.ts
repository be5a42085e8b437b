import { z } from "zod";

import { FuelSystemInputSchema } from "@/lib/calc";
import { BUILD_STATUSES } from "@/lib/domain/builds";

import { versionNumber, versionParam } from "./column-bounds";
import { searchText } from "./search";

const text = (label: string, max: number) =>
  z.string().trim().max(max, `${label} is too long (at most ${max} characters)`);

export const BuildCreateSchema = z.object({
  customerId: z.uuid("Choose a customer"),
  title: text("Title", 120).min(1, "Give the build a title"),
  vehicle: text("Vehicle", 200).optional(),
  inputs: FuelSystemInputSchema.optional(),
});

/**
 * A save: any of the sheet's fields (one left out keeps its stored value; an empty vehicle clears
 * it), the status to move to, a revision note, and the version the edit started from.
 */
export const BuildSaveSchema = BuildCreateSchema.omit({ customerId: true })
  .partial()
  .extend({
    id: z.uuid("Unknown build"),
    version: versionNumber(),
    status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
    note: text("Note", 500).optional(),
  });

/** One build, named by its id (copy as the next power step). */
export const BuildRefSchema = z.object({ id: z.uuid("Unknown build") });

/** Restore an earlier revision as a new one, from the version the page showed as current. */
export const RevisionRestoreSchema = z.object({
  buildId: z.uuid("Unknown build"),
  version: versionNumber(),
  currentVersion: versionNumber("currentVersion"),
});

export const BuildListQuery = z.object({
  q: searchText().optional(),
  status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
  tuner: z.string().trim().min(1).max(64, "Unknown tuner").optional(),
  sort: z
    .enum(["updated", "created", "title"], { error: "Sort by updated, created or title" })
    .default("updated"),
  cursor: z.string().max(400).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(25),
});

/** `GET /api/v1/builds/:id/spec-sheet?version=N`: the revision to print (the latest without one). */
export const SpecSheetQuery = z.object({ version: versionParam().optional() });
