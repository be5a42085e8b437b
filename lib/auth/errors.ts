/** Errors with an HTTP status: mapped to responses by lib/http/errors.ts. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = "HttpError";
  }
}
export class UnauthorizedError extends HttpError {
  constructor() {
    super(401, "unauthorized", "Sign in first");
  }
}
export class ForbiddenError extends HttpError {
  constructor(message = "Your role does not allow this") {
    super(403, "forbidden", message);
  }
}
export class NotFoundError extends HttpError {
  constructor(what = "That") {
    super(404, "not_found", `${what} was not found`);
  }
}
