import { sql } from "drizzle-orm";

import { db } from "@/db";
import { handle } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** Liveness with a database round trip: 200 or 503. */
export const GET = handle(async () => {
  await db.execute(sql`select 1`);
  return Response.json({ ok: true });
});
