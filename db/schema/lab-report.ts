import { sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users } from "./people";
import { testRuns } from "./evidence";

// ── Lab details of a test run ─────────────────────────────────────────────

/**
 * How a run was extracted and analysed and on which parts (what its test report carries), one row
 * per run revision. Validated by `labDetailsSchema`; covered by the run's content hash, so a
 * signed run's details change only through a new revision.
 */
export const testRunLabDetails = sqliteTable("test_run_lab_details", {
  runId: text("run_id")
    .primaryKey()
    .references(() => testRuns.id),
  details: text("details", { mode: "json" }).notNull().$type<Record<string, unknown>>(),
  updatedBy: text("updated_by")
    .notNull()
    .references(() => users.id),
  updatedAt: text("updated_at").notNull(),
});
export type TestRunLabDetails = typeof testRunLabDetails.$inferSelect;
