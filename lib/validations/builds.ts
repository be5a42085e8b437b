import { z } from "zod";

import { FuelSystemInputSchema } from "@/lib/calc";
import { BUILD_STATUSES } from "@/lib/domain/builds";

const text = (label: string, max: number) =>
  z.string().trim().max(max, `${label} is too long (at most ${max} characters)`);

export const BuildCreateSchema = z.object({
  customerId: z.uuid("Choose a customer"),
  title: text("Title", 120).min(1, "Give the build a title"),
  vehicle: text("Vehicle", 200).optional(),
  inputs: FuelSystemInputSchema.optional(),
});

export const BuildSaveSchema = z.object({
  version: z.number({ error: "version is required" }).int().min(1),
  title: text("Title", 120).min(1, "Give the build a title").optional(),
  vehicle: text("Vehicle", 200).optional(),
  status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
  note: text("Note", 500).optional(),
  inputs: FuelSystemInputSchema,
});

export const BuildListQuery = z.object({
  q: z.string().trim().max(100, "Search is too long").optional(),
  status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
  tuner: z.string().trim().min(1).max(64, "Unknown tuner").optional(),
  sort: z
    .enum(["updated", "created", "title"], { error: "Sort by updated, created or title" })
    .default("updated"),
  cursor: z.string().max(400).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(25),
});
