import { FuelSystemInputSchema, dutyAcrossEthanol, dutyAcrossRpm, pumpSupplyCurve, sizeParsedFuelSystem } from "@/lib/calc";
import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/errors";
import { handle } from "@/lib/http/handler";

/** POST /api/v1/calc/size — a FuelSystemInput in canonical units → the sizing result and chart series. */
export const POST = handle(async (req) => {
  await requireMember("calc:use");
  const input = FuelSystemInputSchema.parse(await readJson(req));
  const result = sizeParsedFuelSystem(input);
  return Response.json({
    result,
    charts: {
      dutyVsRpm: dutyAcrossRpm(result, input.engine.idleRpm, input.engine.redlineRpm),
      dutyVsEthanol: dutyAcrossEthanol(input, result.crankPowerKw),
      pumpSupply: pumpSupplyCurve(input, result),
    },
  });
});
