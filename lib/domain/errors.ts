/**
 * The one error vocabulary of the product's commands and queries. Commands (lib/<feature>/
 * commands.ts) throw these; lib/http/errors.ts#describeError turns them into a JSON error or a
 * form's ActionState, the same way for both.
 */

export interface FieldIssue {
  /** `a.b.0`-style path of the field, or "(body)" for the input as a whole. */
  path: string;
  message: string;
}

export abstract class DomainError extends Error {
  abstract readonly code: string;
}

/** Signed out (or the session ended). */
export class Unauthorized extends DomainError {
  readonly code = "unauthorized";
  constructor(message = "Sign in first") {
    super(message);
  }
}

/** The member's role does not allow this. */
export class Forbidden extends DomainError {
  readonly code = "forbidden";
  constructor(message = "Your role does not allow this") {
    super(message);
  }
}

/** No such record in the member's shop (another shop's record is "not found" too). */
export class NotFound extends DomainError {
  readonly code = "not_found";
  constructor(what = "That") {
    super(`${what} was not found`);
  }
}

/**
 * The record changed since the caller read it, or the write clashes with what is stored
 * (a taken SKU, a record still in use). `current` carries the record as it is now, when useful.
 */
export class Conflict<T = unknown> extends DomainError {
  constructor(
    message: string,
    readonly code: string = "conflict",
    readonly current?: T,
    /** The field(s) the clash is about, when one is (a taken SKU: `sku`). */
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
  }
  /** One field clashes: `Conflict.field("sku", "SKU X is already in the catalog", "duplicate_sku")`. */
  static field(path: string, message: string, code = "conflict"): Conflict<never> {
    return new Conflict<never>(message, code, undefined, [{ path, message }]);
  }
}

/**
 * The record's state does not allow this move now (a status step, an edit of a locked quote).
 * `path` names the field the move was asked through ("status" unless said otherwise).
 */
export class InvalidTransition extends DomainError {
  constructor(
    message: string,
    readonly code: string = "invalid_transition",
    readonly path: string = "status",
  ) {
    super(message);
  }
}

/**
 * The input breaks a rule its schema cannot state (an unknown customer, an empty quote).
 * `current` carries what the caller needs to put it right, when useful (a log the mapping could
 * not place: its columns and the mapping tried).
 */
export class Invalid<T = unknown> extends DomainError {
  constructor(
    message: string,
    readonly issues: FieldIssue[] = [],
    readonly code: string = "invalid_input",
    readonly current?: T,
  ) {
    super(message);
  }
  /** One field is wrong: `Invalid.field("customerId", "That customer is not in this shop")`. */
  static field(path: string, message: string, code = "invalid_input"): Invalid<never> {
    return new Invalid(message, [{ path, message }], code);
  }
}

/** Too many attempts from this address or on this account; try again after `retryAfter` seconds. */
export class RateLimited extends DomainError {
  readonly code = "rate_limited";
  constructor(
    message = "Too many attempts. Wait a moment and try again.",
    readonly retryAfter = 10,
  ) {
    super(message);
  }
}

/** A service we depend on (mail, payments, storage) did not answer; nothing was changed. */
export class Unavailable extends DomainError {
  constructor(
    message: string,
    readonly code: string = "unavailable",
    /** 502 when the other service failed, 503 when we are (briefly) unable ourselves. */
    readonly kind: "upstream" | "self" = "upstream",
  ) {
    super(message);
  }
}
