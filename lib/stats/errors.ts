/** Raised for input the statistics cannot accept; `field` names the input at fault. */
export class StatsInputError extends RangeError {
  name = "StatsInputError";
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.field = field;
  }
}

export function requireFinite(value: number, what: string, field?: string): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new StatsInputError(`${what} must be a finite number (got ${String(value)}).`, field);
  }
  return value;
}

export function requireProbability(value: number, what: string, field?: string): number {
  requireFinite(value, what, field);
  if (value <= 0 || value >= 1) {
    throw new StatsInputError(`${what} must lie strictly between 0 and 1 (got ${value}).`, field);
  }
  return value;
}

export function requireSeries(
  values: number[],
  minimum: number,
  what: string,
  field?: string,
): number[] {
  if (!Array.isArray(values) || values.length < minimum) {
    throw new StatsInputError(
      `${what} needs at least ${minimum} value${minimum === 1 ? "" : "s"} (got ${Array.isArray(values) ? values.length : "none"}).`,
      field,
    );
  }
  values.forEach((v, i) => requireFinite(v, `${what}: value ${i + 1}`, field));
  return values;
}
