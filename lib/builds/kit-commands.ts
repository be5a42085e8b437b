import "server-only";

import type { z } from "zod";

import { getBuild, saveBuild } from "@/db/queries/builds";
import { getPartsByIds } from "@/db/queries/parts";
import type { Member } from "@/lib/auth/member";
import { authorize, can } from "@/lib/auth/permissions";
import { applyKit } from "@/lib/catalog/recommend";
import type { ChosenPart, KitRole } from "@/lib/domain/builds";
import { Invalid, NotFound } from "@/lib/domain/errors";
import type { PartCategory } from "@/lib/domain/parts";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";
import type { KitChoiceSchema } from "@/lib/validations/kit";

import { saved, type BuildResult } from "./build-data";
import { catalogPartOf } from "./kit-recommendation";
import { readStoredInputs, sizeForSave } from "./stored-inputs";

/** The catalog category a part must have to fill each kit role. */
const CATEGORY_OF: Record<KitRole, PartCategory> = {
  injector: "injector",
  pump: "pump",
  regulator: "regulator",
  "feed-line": "line",
  "return-line": "line",
  "pre-filter": "filter",
  filter: "filter",
  sensor: "sensor",
};

/**
 * A tuner or owner: writes the chosen catalog parts into the build as a new revision: their data goes into the
 * inputs (injector flow, pump curves, hose bores), the sizing runs on it, and the choice is kept
 * in `builds.parts`; the inputs from before the first choice are kept as the kit's basis, so
 * the ranking does not move. The counter (no `builds:write`): the choice is kept for the quote
 * only and the inputs are left alone. A stale version → Conflict with the current build.
 */
export async function chooseKit(
  m: Member,
  input: z.output<typeof KitChoiceSchema>,
): Promise<BuildResult> {
  authorize(m, "kit:choose");
  const row = await getBuild(m.shopId, input.id);
  if (!row) throw new NotFound("That build");
  const found = new Map(
    (await getPartsByIds(m.shopId, [...new Set(input.parts.map((c) => c.partId))])).map((p) => [
      p.id,
      p,
    ]),
  );
  const chosen = input.parts.map((c, i) => {
    const p = found.get(c.partId);
    if (!p) throw Invalid.field(`parts.${i}.partId`, "A chosen part is not in this shop's catalog");
    const wanted = CATEGORY_OF[c.role];
    if (p.category !== wanted)
      throw Invalid.field(`parts.${i}.role`, `${p.sku} is a ${p.category}, not a ${wanted}`);
    return { role: c.role, part: catalogPartOf(p), quantity: c.quantity };
  });
  const parts: ChosenPart[] = chosen.map((c) => ({
    role: c.role,
    partId: c.part.id,
    sku: c.part.sku,
    name: `${c.part.brand} ${c.part.name}`,
    quantity: c.quantity,
  }));
  // Who may not write build sheets (the counter) chooses parts for the quote only: the parts
  // are kept on the build for its quote, the tuner's sizing (the inputs) stays as it is.
  if (!can(m.role, "builds:write"))
    return saved(
      saveBuild(m.shopId, input.id, m.user.id, input.version, {
        parts,
        note: `Parts chosen for the quote (sizing unchanged): ${parts.map((p) => p.sku).join(", ")}`,
      }),
    );
  return saved(
    saveBuild(m.shopId, input.id, m.user.id, input.version, {
      sized: sizeForSave(
        await shopSizingSettings(m.shopId),
        applyKit(readStoredInputs(row.build), chosen),
      ),
      parts,
      // What the kit ranks against stays the inputs from before the first choice (kitForBuild).
      kitBasis: row.build.kitBasis ?? {
        inputs: row.build.inputs,
        inputsSchemaVersion: row.build.inputsSchemaVersion,
      },
      note: `Parts chosen: ${parts.map((p) => p.sku).join(", ")}`,
    }),
  );
}
