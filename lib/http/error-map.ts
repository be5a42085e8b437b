import { ZodError } from "zod";

import { CalcInputError } from "@/lib/calc";
import {
  Conflict,
  DomainError,
  Forbidden,
  Invalid,
  InvalidTransition,
  NotFound,
  RateLimited,
  Unauthorized,
  Unavailable,
  type FieldIssue,
} from "@/lib/domain/errors";

import { HttpError } from "./http-error";

export type { FieldIssue };

/** Field issues of a ZodError as `a.b.0` paths. */
export function zodIssues(err: ZodError): FieldIssue[] {
  return err.issues.map((i) => ({
    path: i.path.map(String).join(".") || "(body)",
    message: i.message,
  }));
}

/** What any error means to the caller: the one mapping behind JSON errors and action states. */
export interface ErrorDescription {
  status: number;
  code: string;
  message: string;
  issues: FieldIssue[];
  /** On a conflict: the record as it is now; on some refusals, what puts the input right. */
  current?: unknown;
  headers?: Record<string, string>;
}

const RETRY = { "Retry-After": "5" };

/** The one error mapper: domain, validation, transport and outage errors → status and body. */
export function describeError(err: unknown): ErrorDescription {
  if (err instanceof ZodError) {
    return {
      status: 422,
      code: "invalid_input",
      message: "Some fields are not valid",
      issues: zodIssues(err),
    };
  }
  if (err instanceof CalcInputError) {
    return {
      status: 422,
      code: "invalid_input",
      message: err.message,
      issues: [{ path: err.field, message: err.message }],
    };
  }
  if (err instanceof DomainError) {
    const base = { code: err.code, message: err.message, issues: [] as FieldIssue[] };
    if (err instanceof Unauthorized) return { ...base, status: 401 };
    if (err instanceof Forbidden) return { ...base, status: 403 };
    if (err instanceof NotFound) return { ...base, status: 404 };
    if (err instanceof Conflict)
      return { ...base, status: 409, current: err.current, issues: err.issues };
    if (err instanceof InvalidTransition)
      return { ...base, status: 422, issues: [{ path: err.path, message: err.message }] };
    if (err instanceof Invalid)
      return { ...base, status: 422, issues: err.issues, current: err.current };
    if (err instanceof RateLimited)
      return { ...base, status: 429, headers: { "Retry-After": String(err.retryAfter) } };
    if (err instanceof Unavailable) {
      return err.kind === "self"
        ? { ...base, status: 503, headers: RETRY }
        : { ...base, status: 502 };
    }
  }
  if (err instanceof HttpError) {
    return {
      status: err.status,
      code: err.code,
      message: err.message,
      issues: [],
      headers: err.status === 503 ? RETRY : undefined,
    };
  }
  if (isDatabaseDown(err)) {
    return {
      status: 503,
      code: "unavailable",
      message: "The database is not answering; try again in a moment",
      issues: [],
      headers: RETRY,
    };
  }
  console.error(err);
  return { status: 500, code: "internal", message: "Something went wrong on our side", issues: [] };
}

/** Turns any error into the API's one JSON error shape: `{ error: { code, message, issues } }`. */
export function errorResponse(err: unknown): Response {
  const d = describeError(err);
  return Response.json(
    {
      error: { code: d.code, message: d.message, issues: d.issues },
      ...(d.current === undefined ? {} : { current: d.current }),
    },
    { status: d.status, headers: d.headers },
  );
}

const DB_DOWN_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "EPIPE",
  "CONNECT_TIMEOUT",
  "CONNECTION_CLOSED",
  "CONNECTION_ENDED",
  "CONNECTION_DESTROYED",
  "57P01",
  "57P02",
  "57P03",
  "08000",
  "08001",
  "08003",
  "08006",
]);

/** Is this (or what caused it: drizzle and better-auth wrap driver errors) the database being away? */
export function isDatabaseDown(err: unknown): boolean {
  for (
    let e = err, depth = 0;
    e && typeof e === "object" && depth < 5;
    e = (e as { cause?: unknown }).cause, depth++
  ) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && DB_DOWN_CODES.has(code)) return true;
    if (e instanceof AggregateError && e.errors.some((x) => isDatabaseDown(x))) return true;
  }
  return false;
}
