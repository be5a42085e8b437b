import { sql } from "drizzle-orm";

import { db } from "@/db";

/** One round trip to the database (`select 1`); rejects when it does not answer. */
export async function pingDatabase(): Promise<void> {
  await db.execute(sql`select 1`);
}
