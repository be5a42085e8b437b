import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";

export const dynamic = "force-dynamic";

/** An address under /api that no route answers: a JSON 404 naming it, never the HTML page. */
const unknown = handle(async (req) => {
  throw new HttpError(404, "unknown_route", `No API at ${new URL(req.url).pathname}`);
});

export const GET = unknown;
export const POST = unknown;
export const PUT = unknown;
export const PATCH = unknown;
export const DELETE = unknown;
