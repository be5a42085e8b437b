import { errorResponse } from "./error-map";

type Handler<C> = (req: Request, ctx: C) => Promise<Response>;

/** Wraps a route handler so that every thrown error becomes a clean JSON response. */
export function handle<C = unknown>(fn: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    try {
      return await fn(req, ctx);
    } catch (e) {
      return errorResponse(e);
    }
  };
}
