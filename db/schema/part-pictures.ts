import { sqliteTable, text } from "drizzle-orm/sqlite-core";
import { evidenceFiles } from "./evidence";
import { partFamilies } from "./parts";
import { users } from "./people";

/**
 * The picture shown on a part family's page, so an operator recognises the parts at the washer.
 * The image is stored like any file, under its SHA-256; a new upload replaces the row, and the
 * audit trail keeps which file was shown before.
 */
export const partFamilyPictures = sqliteTable("part_family_pictures", {
  partFamilyId: text("part_family_id")
    .primaryKey()
    .references(() => partFamilies.id),
  fileId: text("file_id")
    .notNull()
    .references(() => evidenceFiles.id),
  uploadedBy: text("uploaded_by")
    .notNull()
    .references(() => users.id),
  uploadedAt: text("uploaded_at").notNull(),
});
export type PartFamilyPicture = typeof partFamilyPictures.$inferSelect;
