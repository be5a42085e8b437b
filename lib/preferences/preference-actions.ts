"use server";

import { memberAction } from "@/lib/actions/member-action";
import { setUnits } from "@/lib/preferences/preference-commands";
import { UnitsSchema } from "@/lib/validations/settings";

/**
 * The signed-in person's display and entry units. Nothing to revalidate: the build editor that
 * calls it converts its own fields, and every page reads the choice when it is next drawn.
 */
export const setUnitsAction = memberAction(UnitsSchema, async (m, input) => {
  const { units } = await setUnits(m, input);
  return { ok: true, message: `Units: ${units}` };
});
