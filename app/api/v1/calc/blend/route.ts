import { z } from "zod";

import { requireMember } from "@/lib/auth/member";
import {
  BlendMixSchema,
  ethanolFromFlexSensorHz,
  fillSplit,
  FillSplitSchema,
  FlexSensorSchema,
  mixFuels,
  volumeToAdd,
  VolumeToAddSchema,
} from "@/lib/calc";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";

const BlendRequest = z.discriminatedUnion(
  "kind",
  [
    z.object({ kind: z.literal("mix"), ...BlendMixSchema.shape }),
    z.object({ kind: z.literal("volume-to-add"), ...VolumeToAddSchema.shape }),
    z.object({ kind: z.literal("fill-split"), ...FillSplitSchema.shape }),
    z.object({ kind: z.literal("flex-sensor"), ...FlexSensorSchema.shape }),
  ],
  { error: "kind must be mix, volume-to-add, fill-split or flex-sensor" },
);

/** POST /api/v1/calc/blend — the blend mixer's solvers, chosen by `kind`. */
export const POST = handle(async (req) => {
  await requireMember("calc:use");
  const body = BlendRequest.parse(await readJson(req));
  switch (body.kind) {
    case "mix":
      return Response.json({ result: mixFuels(body.parts) });
    case "volume-to-add":
      return Response.json({ result: volumeToAdd(body) });
    case "fill-split":
      return Response.json({ result: fillSplit(body) });
    case "flex-sensor":
      return Response.json({
        result: { ethanolVolPct: ethanolFromFlexSensorHz(body.frequencyHz) },
      });
  }
});
