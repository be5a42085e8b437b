import { getTableColumns } from "drizzle-orm";
import { describe, expect, expectTypeOf, it } from "vitest";

import type { SessionMemberRow } from "@/db/queries/members";
import { SHOP_SIZING_COLUMNS, shopSettings, type ShopSettings } from "@/db/schema/shops";
import { sizingSettingsOf, type ShopSizingColumns } from "@/lib/sizing/fill-inputs";

/**
 * The shop's sizing columns are named once (db/schema/shops.ts#SHOP_SIZING_COLUMNS) and typed
 * from the settings row itself, so the session look-up (which reads them for the sizing route)
 * and the sizing (which maps them) cannot disagree and a new column cannot be missed by one.
 * Check values: the schema's own columns (no outside source needed: a consistency check).
 */
describe("the shop's sizing columns", () => {
  it("are columns of the settings table, numbers (real), each named once", () => {
    const columns = getTableColumns(shopSettings);
    expect(new Set(SHOP_SIZING_COLUMNS).size).toBe(SHOP_SIZING_COLUMNS.length);
    for (const k of SHOP_SIZING_COLUMNS) {
      expect(columns[k], k).toBeDefined();
      expect(columns[k].columnType, k).toBe("PgReal");
    }
  });

  it("are exactly what sizingSettingsOf reads", () => {
    const read = new Set<string>();
    const row = new Proxy({} as ShopSizingColumns, {
      get: (_, key) => {
        read.add(String(key));
        return 1;
      },
    });
    sizingSettingsOf(row);
    expect([...read].sort()).toEqual([...SHOP_SIZING_COLUMNS].sort());
  });

  it("are typed from the settings row, the same type in the session look-up and the sizing", () => {
    expectTypeOf<ShopSizingColumns>().toEqualTypeOf<
      Pick<ShopSettings, (typeof SHOP_SIZING_COLUMNS)[number]>
    >();
    expectTypeOf<SessionMemberRow["shopSizing"]>().toEqualTypeOf<ShopSizingColumns | null>();
  });
});
