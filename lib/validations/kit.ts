import { z } from "zod";

import { KIT_ROLES } from "@/lib/domain/builds";

import { versionNumber } from "./column-bounds";

/** The parts chosen for a build, by role. */
export const KitChoiceSchema = z.object({
  id: z.uuid("Unknown build"),
  version: versionNumber(),
  parts: z
    .array(
      z.object({
        role: z.enum(KIT_ROLES, { error: "Unknown kit role" }),
        partId: z.uuid("Unknown part"),
        quantity: z.number().int().min(1).max(100),
      }),
    )
    .min(1, "Choose at least one part")
    .max(20),
});
