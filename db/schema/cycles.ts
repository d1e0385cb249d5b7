import {
  index,
  integer,
  primaryKey,
  sqliteTable,
  text,
  uniqueIndex,
} from "drizzle-orm/sqlite-core";
import { bool, createdAt, id } from "./columns";
import { partFamilies } from "./parts";
import { users } from "./people";
import { cleaningSystems } from "./plant";
import { recipeVersions } from "./recipes";

// ── Wash cycles and lots ──────────────────────────────────────────────────

/** How a cycle reached us: typed in, a washer's log file, or a machine feed through the API. */
export const CYCLE_SOURCES = ["form", "csv", "api"] as const;
export type CycleSource = (typeof CYCLE_SOURCES)[number];

/**
 * One run of a washer: what was loaded (part family, lots, baskets), on which recipe version, and the
 * values the machine actually held. Flagged when a value left its validated range.
 */
export const washCycles = sqliteTable(
  "wash_cycles",
  {
    id: id(),
    systemId: text("system_id")
      .notNull()
      .references(() => cleaningSystems.id),
    /** The washer's own cycle id, as its log prints it; unique per washer. */
    cycleNumber: text("cycle_number").notNull(),
    recipeVersionId: text("recipe_version_id")
      .notNull()
      .references(() => recipeVersions.id),
    partFamilyId: text("part_family_id")
      .notNull()
      .references(() => partFamilies.id),
    baskets: integer("baskets").notNull(),
    startedAt: text("started_at").notNull(),
    endedAt: text("ended_at").notNull(),
    /** As the washer's log or the operator names them: machine feeds carry badge names, not accounts. */
    operator: text("operator").notNull(),
    /** Actual values by recipe parameter key ("wash.temperature" → 62.5), in the parameter's unit. */
    actualValues: text("actual_values", { mode: "json" }).$type<Record<string, number>>().notNull(),
    flagged: bool("flagged").notNull().default(false),
    flagReasons: text("flag_reasons", { mode: "json" }).$type<string[]>().notNull(),
    source: text("source", { enum: CYCLE_SOURCES }).notNull(),
    /** The recording (form, file or API call) the cycle came in with; its audit event names it. */
    batchId: text("batch_id").notNull(),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("wash_cycles_system_number_uq").on(t.systemId, t.cycleNumber),
    index("wash_cycles_version_started_idx").on(t.recipeVersionId, t.startedAt),
    index("wash_cycles_started_idx").on(t.startedAt),
    index("wash_cycles_batch_idx").on(t.batchId),
  ],
);
export type WashCycle = typeof washCycles.$inferSelect;

/** A lot washed in a cycle; a lot can span several cycles and a cycle hold several lots. */
export const washCycleLots = sqliteTable(
  "wash_cycle_lots",
  {
    lotNumber: text("lot_number").notNull(),
    cycleId: text("cycle_id")
      .notNull()
      .references(() => washCycles.id),
  },
  // The lot comes first: a lot lookup (and a prefix search) reads one range of the key.
  (t) => [
    primaryKey({ columns: [t.lotNumber, t.cycleId] }),
    index("wash_cycle_lots_cycle_idx").on(t.cycleId),
  ],
);
export type WashCycleLot = typeof washCycleLots.$inferSelect;
