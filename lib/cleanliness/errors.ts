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
}
