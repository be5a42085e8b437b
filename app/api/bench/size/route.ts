import { FuelSystemInputSchema, sizingAnswer } from "@/lib/calc";
import { LIBRARY_SIZING_SETTINGS, parsedEffectiveInputs } from "@/lib/sizing/effective-inputs";

export const dynamic = "force-dynamic";

/**
 * POST /api/bench/size — the yardstick of `npm run bench:http`: the sizing route's work (the same
 * validation, effective inputs and answer) in a bare route handler of the same framework, with
 * no session, no shop and no database. Served only when BENCH_ROUTES=on (the benchmark's server);
 * anywhere else it is not found.
 */
export async function POST(req: Request): Promise<Response> {
  if (process.env.BENCH_ROUTES !== "on")
    return Response.json({ error: { code: "not_found", message: "Not found" } }, { status: 404 });
  try {
    const parsed = FuelSystemInputSchema.safeParse(await req.json());
    if (!parsed.success) return Response.json({ error: parsed.error.issues }, { status: 422 });
    const inputs = parsedEffectiveInputs(LIBRARY_SIZING_SETTINGS, parsed.data);
    return Response.json({ ...sizingAnswer(inputs), inputs });
  } catch {
    return Response.json({ error: { code: "bad_json", message: "Bad JSON" } }, { status: 400 });
  }
}
