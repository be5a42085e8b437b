import { requireSizingMember } from "@/lib/auth/member";
import { FuelSystemInputSchema, sizingAnswer } from "@/lib/calc";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { parsedEffectiveInputs } from "@/lib/sizing/effective-inputs";

/**
 * POST /api/v1/calc/size — a FuelSystemInput in canonical units → the sizing result and chart
 * series, with the member's shop settings (limits, BSFC rules of thumb, drivetrain loss by drive
 * type, fuel properties) for every value the body leaves out; `inputs` is what was sized.
 */
export const POST = handle(async (req) => {
  // One round trip: the session query reads the shop's sizing settings too.
  const { sizing } = await requireSizingMember("calc:use");
  const body = FuelSystemInputSchema.parse(await readJson(req));
  const inputs = parsedEffectiveInputs(sizing, body);
  return Response.json({ ...sizingAnswer(inputs), inputs });
});
