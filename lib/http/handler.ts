import { countQueries } from "@/db/query-count";
import { Invalid } from "@/lib/domain/errors";

import { isJsonType } from "./body";
import { errorResponse } from "./error-map";
import { HttpError } from "./http-error";
import { crossSiteRefusal, isUnsafeMethod } from "./same-origin";
import { controlCharacterIssue } from "./text";

type Handler<C> = (req: Request, ctx: C) => Promise<Response>;

export interface HandleOptions {
  /**
   * The media types a write's body may have, for an upload that is not JSON (a CSV, an image's
   * bytes), and what to say when it has another. Without it a body must be JSON.
   */
  accepts?: { types: readonly string[]; message: string };
}

/**
 * Wraps a route handler: writes to the JSON API from another site are refused (403), a write
 * whose body is not of the route's type is refused (415: JSON unless the route takes an upload),
 * query parameters carrying control characters are refused (422), and every thrown error
 * becomes one clean JSON response through the one error mapper.
 */
export function handle<C = unknown>(fn: Handler<C>, options: HandleOptions = {}): Handler<C> {
  const answer: Handler<C> = async (req, ctx) => {
    try {
      const url = new URL(req.url);
      if (url.pathname.startsWith("/api/v1/") && isUnsafeMethod(req.method)) {
        const refusal = crossSiteRefusal(req);
        if (refusal) throw new HttpError(403, "cross_site", refusal);
        const typeProblem = bodyTypeProblem(req, options);
        if (typeProblem) throw new HttpError(415, "unsupported_type", typeProblem);
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
  if (process.env.DB_QUERY_COUNT !== "on") return answer;
  // The test servers: every answer, a refusal too, says how many statements it cost.
  return async (req, ctx) => {
    const { value, queries } = await countQueries(() => answer(req, ctx));
    const res = new Response(value.body, value);
    res.headers.set("x-db-round-trips", String(queries));
    return res;
  };
}

/**
 * Why a write's body may not be read as this route's kind, or null. A write with no body at all
 * (a DELETE, a POST that only names its target) passes; one with a body, or naming a type, must
 * name one the route takes — so a form another page posts (text/plain, urlencoded, multipart)
 * is never read as JSON.
 */
function bodyTypeProblem(req: Request, options: HandleOptions): string | null {
  const declared = req.headers.get("content-type");
  const length = req.headers.get("content-length");
  const hasBody =
    (length !== null && length.trim() !== "0") || req.headers.has("transfer-encoding");
  if (!declared && !hasBody) return null;
  const type = (declared ?? "").split(";")[0]!.trim().toLowerCase();
  if (options.accepts) return options.accepts.types.includes(type) ? null : options.accepts.message;
  return isJsonType(declared) ? null : "Send the body as JSON (Content-Type: application/json)";
}
