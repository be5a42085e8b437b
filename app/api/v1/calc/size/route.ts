import { requireMember } from "@/lib/auth/member";
import { FuelSystemInputSchema, sizingAnswer } from "@/lib/calc";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { parsedEffectiveInputs } from "@/lib/sizing/effective-inputs";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";

/**
 * POST /api/v1/calc/size — a FuelSystemInput in canonical units → the sizing result and chart
 * series, with the member's shop settings (limits, BSFC rules of thumb, drivetrain loss by drive
 * type, fuel properties) for every value the body leaves out; `inputs` is what was sized.
 */
export const POST = handle(async (req) => {
  const m = await requireMember("calc:use");
  const body = FuelSystemInputSchema.parse(await readJson(req));
  const inputs = parsedEffectiveInputs(await shopSizingSettings(m.shopId), body);
  return Response.json({ ...sizingAnswer(inputs), inputs });
});
