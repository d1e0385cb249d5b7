import { sql, type AnyColumn, type SQL } from "drizzle-orm";

/** Rows a server-paged list shows at a time. */
export const LIST_PAGE_SIZE = 50;

/** The words of a list's search box, each of which a row must contain. */
export function searchWords(q: string | undefined): string[] {
  return (q ?? "").toLowerCase().split(/\s+/).filter(Boolean);
}

/** `%` and `_` in a search word match themselves. */
const likeContains = (word: string) => `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** True where any of the fields contains the word, in any case (LIKE folds ASCII letters). */
export function anyFieldContains(word: string, fields: (AnyColumn | SQL)[]): SQL {
  const pattern = likeContains(word);
  return sql`(${sql.join(
    fields.map((f) => sql`${f} like ${pattern} escape '\\'`),
    sql` or `,
  )})`;
}

/** The page to show of `total` rows: the one asked for, kept within the pages there are. */
export function pageWithin(total: number, requested: number | undefined) {
  const pages = Math.max(1, Math.ceil(total / LIST_PAGE_SIZE));
  const page = Math.min(Math.max(1, Math.trunc(requested ?? 1) || 1), pages);
  return { page, pages, offset: (page - 1) * LIST_PAGE_SIZE, limit: LIST_PAGE_SIZE };
}
