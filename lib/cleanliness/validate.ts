import { CleanlinessInputError } from "./errors";

// Internal guards shared by the cleanliness modules; each throws CleanlinessInputError.

export function requireFinite(value: number, what: string, field?: string): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new CleanlinessInputError(
      `${what} must be a finite number (got ${String(value)}).`,
      field,
    );
  }
  return value;
}

export function requireNonNegative(value: number, what: string, field?: string): number {
  requireFinite(value, what, field);
  if (value < 0)
    throw new CleanlinessInputError(`${what} must not be negative (got ${value}).`, field);
  return value;
}

export function requirePositive(value: number, what: string, field?: string): number {
  requireFinite(value, what, field);
  if (value <= 0) {
    throw new CleanlinessInputError(`${what} must be greater than zero (got ${value}).`, field);
  }
  return value;
}

export function requirePositiveInteger(value: number, what: string, field?: string): number {
  requirePositive(value, what, field);
  if (!Number.isInteger(value)) {
    throw new CleanlinessInputError(`${what} must be a whole number (got ${value}).`, field);
  }
  return value;
}

/** A fraction strictly between 0 and 1, such as a decay-value or blank-value limit. */
export function requireOpenFraction(value: number, what: string, field?: string): number {
  requireFinite(value, what, field);
  if (value <= 0 || value >= 1) {
    throw new CleanlinessInputError(
      `${what} must lie strictly between 0 and 1 (got ${value}).`,
      field,
    );
  }
  return value;
}
