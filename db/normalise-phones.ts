import type postgres from "postgres";

import { isE164, readPhone } from "@/lib/format/phone";

/**
 * Phone numbers stored before they were read (migration 0012): each one that reads as a number
 * in its shop's country becomes E.164; one that does not (no area code, say) stays as typed and
 * is still shown and found as it was. Idempotent: E.164 values are left alone.
 */
export async function normaliseStoredPhones(sql: postgres.Sql): Promise<number> {
  const rows = await sql<{ id: string; phone: string; country: string }[]>`
    select c.id, c.phone, coalesce(s.country, 'US') as country
    from customers c left join shop_settings s on s.shop_id = c.shop_id
    where c.phone is not null and c.phone !~ '^\\+[1-9][0-9]{6,14}$'`;
  let changed = 0;
  for (const r of rows) {
    if (isE164(r.phone)) continue;
    const read = readPhone(r.phone, r.country);
    if (!read.ok) continue;
    // No new version: the number is the same, only its spelling is.
    await sql`update customers set phone = ${read.e164} where id = ${r.id} and phone = ${r.phone}`;
    changed++;
  }
  return changed;
}
