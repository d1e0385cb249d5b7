/** An error whose message is safe to show to the user; anything else is logged and replaced. */
export class UserFacingError extends Error {
  constructor(
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = "UserFacingError";
  }
}

export function toActionFailure(error: unknown): { ok: false; message: string; fieldErrors?: Record<string, string[]> } {
  if (error instanceof UserFacingError) {
    return { ok: false, message: error.message, fieldErrors: error.field ? { [error.field]: [error.message] } : undefined };
  }
  console.error(error);
  return { ok: false, message: "Something went wrong on the server. Nothing was changed; try again." };
}

export function isUniqueViolation(error: unknown): boolean {
  const text = String((error as { cause?: unknown })?.cause ?? error);
  return /UNIQUE constraint failed/.test(text);
}
