import type { z } from "zod";

import { setUnitSystem } from "@/db/queries/preferences";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import type { UnitsSchema } from "@/lib/validations/settings";

/** The signed-in person's display and entry units (kept on their account, for every shop). */
export async function setUnits(
  member: Member,
  input: z.output<typeof UnitsSchema>,
): Promise<{ units: "metric" | "imperial" }> {
  authorize(member, "staff:view");
  await setUnitSystem(member.user.id, input.units);
  return { units: input.units };
}
