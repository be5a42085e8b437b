import { z } from "zod";

import { BlendMixSchema, FillSplitSchema, FlexSensorSchema, VolumeToAddSchema } from "@/lib/calc";

/** `POST /api/v1/calc/blend`: which of the blend mixer's solvers (`kind`) and its inputs. */
export const BlendRequestSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({ kind: z.literal("mix"), ...BlendMixSchema.shape }),
    z.object({ kind: z.literal("volume-to-add"), ...VolumeToAddSchema.shape }),
    z.object({ kind: z.literal("fill-split"), ...FillSplitSchema.shape }),
    z.object({ kind: z.literal("flex-sensor"), ...FlexSensorSchema.shape }),
  ],
  { error: "kind must be mix, volume-to-add, fill-split or flex-sensor" },
);
