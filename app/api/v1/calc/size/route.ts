import { requireMember } from "@/lib/auth/member";
import { FuelSystemInputSchema, sizingAnswer } from "@/lib/calc";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";

/** POST /api/v1/calc/size — a FuelSystemInput in canonical units → the sizing result and chart series. */
export const POST = handle(async (req) => {
  await requireMember("calc:use");
  const input = FuelSystemInputSchema.parse(await readJson(req));
  return Response.json(sizingAnswer(input));
});
