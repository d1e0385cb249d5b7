/**
 * Raised for input the cleanliness computations cannot accept. The message names the value and
 * the rule it breaks so it can be shown to the person who typed it; `field` names the input.
 */
export class CleanlinessInputError extends RangeError {
  name = "CleanlinessInputError";
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.field = field;
  }
}

/** Raised by `parseCleanlinessSpec` for text that is not a valid specification in CCC notation. */
export class CleanlinessSpecError extends CleanlinessInputError {
  name = "CleanlinessSpecError";
  /** 1-based character position in the text as typed (spaces counted), when one can be named. */
  readonly position: number | undefined;

  constructor(message: string, field?: string, position?: number) {
    super(position === undefined ? message : `${message} (at character ${position})`, field);
    this.position = position;
  }
}
