/** An error of the HTTP transport itself (a body too large, not JSON, of the wrong type). */
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
