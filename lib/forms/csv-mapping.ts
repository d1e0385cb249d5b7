/**
 * Whether a CSV file's columns need the user's matching: a required field is unmatched or
 * ambiguous (`problems`), or a column of the file matches none of ours.
 */
export function columnsNeedMatching(
  headers: readonly string[],
  mapping: Record<string, string | undefined>,
  problems: readonly string[],
): boolean {
  if (headers.length === 0) return false;
  const matched = new Set(Object.values(mapping));
  return problems.length > 0 || headers.some((h) => !matched.has(h));
}
