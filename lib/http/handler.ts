import { Invalid } from "@/lib/domain/errors";

import { errorResponse } from "./error-map";
import { HttpError } from "./http-error";
import { crossSiteRefusal } from "./same-origin";
import { controlCharacterIssue } from "./text";

type Handler<C> = (req: Request, ctx: C) => Promise<Response>;

/**
 * Wraps a route handler: writes to the JSON API from another site are refused (403), query
 * parameters carrying control characters are refused (422), and every thrown error becomes one
 * clean JSON response through the one error mapper.
 */
export function handle<C = unknown>(fn: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    try {
      const url = new URL(req.url);
      if (url.pathname.startsWith("/api/v1/")) {
        const refusal = crossSiteRefusal(req);
        if (refusal) throw new HttpError(403, "cross_site", refusal);
      }
      for (const [key, value] of url.searchParams) {
        const issue = controlCharacterIssue(value, key);
        if (issue) throw new Invalid(issue.message, [issue]);
      }
      return await fn(req, ctx);
    } catch (e) {
      return errorResponse(e);
    }
  };
}
