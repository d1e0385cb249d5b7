import { sqliteTable, text } from "drizzle-orm/sqlite-core";
import { createdAt } from "./columns";
import { changeRequests } from "./changes";
import { cleanlinessSpecs } from "./parts";
import { cleaningSystems } from "./plant";

// ── Change control: what changed besides the recipe ───────────────────────

/**
 * A change request opened because a customer specification was revised: the recipe may stay as
 * it is, but its validation was proven against the old limits. The two revisions are kept so the
 * change screens show the limits old → new.
 */
export const changeRequestSpecs = sqliteTable("change_request_specs", {
  changeRequestId: text("change_request_id")
    .primaryKey()
    .references(() => changeRequests.id),
  fromSpecId: text("from_spec_id")
    .notNull()
    .references(() => cleanlinessSpecs.id),
  toSpecId: text("to_spec_id")
    .notNull()
    .references(() => cleanlinessSpecs.id),
  createdAt: createdAt(),
});
export type ChangeRequestSpec = typeof changeRequestSpecs.$inferSelect;

/**
 * A change request for a washer's equipment: the stages as they were when it was opened and as
 * proposed. Closing the change writes the proposed stages to the washer (`appliedAt`).
 */
export const changeRequestEquipment = sqliteTable("change_request_equipment", {
  changeRequestId: text("change_request_id")
    .primaryKey()
    .references(() => changeRequests.id),
  systemId: text("system_id")
    .notNull()
    .references(() => cleaningSystems.id),
  /** The system's name, description and stages (with their ids) when the change was opened. */
  before: text("before", { mode: "json" }).notNull(),
  /** The whole edit as the washer's editor submitted it (the system schema's shape). */
  after: text("after", { mode: "json" }).notNull(),
  appliedAt: text("applied_at"),
  createdAt: createdAt(),
});
export type ChangeRequestEquipment = typeof changeRequestEquipment.$inferSelect;
