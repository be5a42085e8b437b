import { pingDatabase } from "@/db/queries/health";
import { handle } from "@/lib/http/handler";

export const dynamic = "force-dynamic";

/** Liveness with a database round trip: 200 or 503. */
export const GET = handle(async () => {
  await pingDatabase();
  return Response.json({ ok: true });
});
