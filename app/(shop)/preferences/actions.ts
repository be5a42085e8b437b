"use server";

import { z } from "zod";

import { setUnitSystem } from "@/db/queries/preferences";
import { memberAction } from "@/lib/actions/member-action";

const UnitsSchema = z.object({
  units: z.enum(["metric", "imperial"], { error: "Units must be metric or imperial" }),
});

/** The signed-in person's display and entry units (kept on their account, for every shop). */
export const setUnitsAction = memberAction("staff:view", UnitsSchema, async ({ units }, m) => {
  await setUnitSystem(m.user.id, units);
  return { ok: true, message: `Units: ${units}` };
});
