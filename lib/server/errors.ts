/**
 * What kind of refusal an error is. The kind, not the message, decides the HTTP status, so an
 * API client can tell "no such record" from "someone changed it first" without reading prose.
 */
export const ERROR_KINDS = [
  "invalid",
  "not_found",
  "conflict",
  "forbidden",
  "locked",
  "too_large",
  "unavailable",
] as const;
export type ErrorKind = (typeof ERROR_KINDS)[number];

/** The one place a kind becomes a status (RFC 9110 §15.5; 423 is WebDAV's Locked, RFC 4918 §11.3). */
export const ERROR_STATUS: Record<ErrorKind, number> = {
  invalid: 422,
  not_found: 404,
  conflict: 409,
  forbidden: 403,
  locked: 423,
  too_large: 413,
  unavailable: 503,
};

export interface UserFacingErrorOptions {
  kind?: ErrorKind;
  /** The form field the message belongs beside. */
  field?: string;
  /** Several fields at once (a second schema parsed inside an action). */
  fieldErrors?: Record<string, string[]>;
}

/**
 * An error whose message is safe to show to the user; anything else is logged and replaced.
 * Without a kind it is a conflict: the request was understood but the record's state refuses it.
 */
export class UserFacingError extends Error {
  readonly kind: ErrorKind;
  readonly field?: string;
  readonly fieldErrors?: Record<string, string[]>;

  constructor(message: string, fieldOrOptions?: string | UserFacingErrorOptions) {
    super(message);
    this.name = "UserFacingError";
    const options =
      typeof fieldOrOptions === "string" ? { field: fieldOrOptions } : (fieldOrOptions ?? {});
    this.kind = options.kind ?? "conflict";
    this.field = options.field;
    this.fieldErrors =
      options.fieldErrors ?? (options.field ? { [options.field]: [message] } : undefined);
  }
}

export const notFoundError = (message: string, field?: string) =>
  new UserFacingError(message, { kind: "not_found", field });
export const invalidError = (message: string, field?: string) =>
  new UserFacingError(message, { kind: "invalid", field });
export const lockedError = (message: string, field?: string) =>
  new UserFacingError(message, { kind: "locked", field });

const GENERIC = "Something went wrong on the server. Nothing was changed; try again.";
const UNAVAILABLE =
  "The database cannot take changes at the moment (it is busy or read-only). Nothing was changed; try again in a minute, and tell the administrator if it persists.";

/** SQLite refusing to write for reasons outside the request: busy past the timeout, or opened read-only. */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (
    let e: unknown = error, depth = 0;
    e && depth < 4;
    e = (e as { cause?: unknown }).cause, depth++
  ) {
    const code = String((e as { code?: unknown }).code ?? "");
    if (/^SQLITE_(BUSY|READONLY|LOCKED)/.test(code)) return true;
    if (
      /SQLITE_(BUSY|READONLY)|database is locked|attempt to write a readonly database/i.test(
        String((e as { message?: unknown }).message ?? ""),
      )
    )
      return true;
  }
  return false;
}

/**
 * A bookkeeping write made while serving a read (a token's last use, a session's sliding expiry):
 * when the database cannot take writes, the read still answers and the bookkeeping is skipped.
 * Any other error is the caller's.
 */
export async function unlessUnavailable(write: () => Promise<unknown>): Promise<void> {
  try {
    await write();
  } catch (error) {
    if (!isDatabaseUnavailable(error)) throw error;
  }
}

export interface Failure {
  kind: ErrorKind | "internal";
  status: number;
  message: string;
  fieldErrors?: Record<string, string[]>;
}

/** Any thrown value as what the caller may be told: a user-facing error as it is, anything else logged and replaced. */
export function describeFailure(error: unknown): Failure {
  if (error instanceof UserFacingError) {
    return {
      kind: error.kind,
      status: ERROR_STATUS[error.kind],
      message: error.message,
      fieldErrors: error.fieldErrors,
    };
  }
  console.error(error);
  if (isDatabaseUnavailable(error))
    return { kind: "unavailable", status: ERROR_STATUS.unavailable, message: UNAVAILABLE };
  return { kind: "internal", status: 500, message: GENERIC };
}

export function toActionFailure(error: unknown): {
  ok: false;
  message: string;
  fieldErrors?: Record<string, string[]>;
} {
  const { message, fieldErrors } = describeFailure(error);
  return { ok: false, message, fieldErrors };
}

export function isUniqueViolation(error: unknown): boolean {
  const text = String((error as { cause?: unknown })?.cause ?? error);
  return /UNIQUE constraint failed/.test(text);
}
