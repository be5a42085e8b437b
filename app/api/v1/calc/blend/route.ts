import { requireMember } from "@/lib/auth/member";
import { ethanolFromFlexSensorHz, fillSplit, mixFuels, volumeToAdd } from "@/lib/calc";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { BlendRequestSchema } from "@/lib/validations/calc";

/** POST /api/v1/calc/blend — the blend mixer's solvers, chosen by `kind`. */
export const POST = handle(async (req) => {
  await requireMember("calc:use");
  const body = BlendRequestSchema.parse(await readJson(req));
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
