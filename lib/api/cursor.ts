/**
 * Opaque keyset cursors: the sort key and id of the last row of a page, so the
 * next page starts after it even when rows are added meanwhile.
 */
export function encodeCursor(key: string, id: string): string {
  return Buffer.from(JSON.stringify([key, id]), "utf8").toString("base64url");
}

export function decodeCursor(cursor: string): { key: string; id: string } | null {
  try {
    const value: unknown = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
    if (
      Array.isArray(value) &&
      value.length === 2 &&
      typeof value[0] === "string" &&
      typeof value[1] === "string"
    )
      return { key: value[0], id: value[1] };
  } catch {
    // fall through: not a cursor we issued
  }
  return null;
}

/** A cursor the server did not issue: the caller's mistake (400), not a conflict. */
export class BadCursorError extends Error {
  readonly field = "cursor";
  constructor() {
    super("The cursor is not valid. Pass nextCursor from the previous page unchanged.");
    this.name = "BadCursorError";
  }
}
