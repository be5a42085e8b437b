// Reference: docs/calculations.md §9.
import { z } from "zod";

import { FuelSystemInputSchema } from "./schema";

/*
 * Apart from the registry, so that a page that only formats figures does not load the schema;
 * only re-saying a validation message needs the bounds.
 */

interface Bounds {
  min?: number;
  max?: number;
}
let boundsCache: Map<string, Bounds> | null = null;

/** The lowest and highest value the schema allows at an input path, from its JSON Schema. */
export function inputBounds(path: string): Bounds | undefined {
  if (!boundsCache) {
    boundsCache = new Map();
    const walk = (node: unknown, p: string) => {
      if (!node || typeof node !== "object") return;
      const n = node as Record<string, unknown>;
      if (n.type === "number" || n.type === "integer") {
        boundsCache!.set(p, {
          min: typeof n.minimum === "number" ? n.minimum : undefined,
          max: typeof n.maximum === "number" ? n.maximum : undefined,
        });
      }
      if (n.properties && typeof n.properties === "object")
        for (const [k, v] of Object.entries(n.properties)) walk(v, p ? `${p}.${k}` : k);
      if (n.items) walk(n.items, p ? `${p}.*` : "*");
      for (const key of ["anyOf", "oneOf", "allOf"] as const)
        if (Array.isArray(n[key])) for (const v of n[key] as unknown[]) walk(v, p);
    };
    walk(z.toJSONSchema(FuelSystemInputSchema, { io: "input", unrepresentable: "any" }), "");
  }
  return boundsCache.get(path.replace(/(^|\.)\d+(?=\.|$)/g, "$1*"));
}
