import { integer, text } from "drizzle-orm/sqlite-core";

/** Times are ISO-8601 UTC strings (sortable, readable in the audit trail), except lucia's session expiry. */
export const id = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());
export const createdAt = () =>
  text("created_at")
    .notNull()
    .$defaultFn(() => new Date().toISOString());
export const bool = (name: string) => integer(name, { mode: "boolean" });
