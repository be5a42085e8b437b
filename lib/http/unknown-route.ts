import { handle } from "./handler";
import { HttpError } from "./http-error";

/** An address under /api that no route answers: a JSON 404 naming it, never the HTML page. */
export const unknownRoute = handle(async (req) => {
  throw new HttpError(404, "unknown_route", `No API at ${new URL(req.url).pathname}`);
});
