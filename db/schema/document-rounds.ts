import { integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, id } from "./columns";
import { documentVersions } from "./documents";

/**
 * The text of a document version exactly as it was submitted in each review round. A draft is
 * edited in place, so without this a reviewer on the second round could not see what changed
 * since they sent it back. Written in the submission's transaction; never changed.
 */
export const documentRoundTexts = sqliteTable(
  "document_round_texts",
  {
    id: id(),
    versionId: text("version_id")
      .notNull()
      .references(() => documentVersions.id),
    round: integer("round").notNull(),
    contentHash: text("content_hash").notNull(),
    content: text("content", { mode: "json" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("document_round_texts_uq").on(t.versionId, t.round)],
);
export type DocumentRoundText = typeof documentRoundTexts.$inferSelect;
