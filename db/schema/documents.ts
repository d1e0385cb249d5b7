import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import {
  DOCUMENT_TYPES,
  DOCUMENT_STATUSES,
  REVIEW_ROLES,
  REVIEW_DECISIONS,
  ROUTING_MODES,
} from "../enums";
import { createdAt, id } from "./columns";
import { partFamilies } from "./parts";
import { users } from "./people";
import { cleaningSystems } from "./plant";
import { recipeVersions } from "./recipes";

// ── Documents ─────────────────────────────────────────────────────────────

export const documents = sqliteTable("documents", {
  id: id(),
  number: text("number").notNull().unique(),
  title: text("title").notNull(),
  type: text("type", { enum: DOCUMENT_TYPES }).notNull(),
  systemId: text("system_id").references(() => cleaningSystems.id),
  partFamilyId: text("part_family_id").references(() => partFamilies.id),
  recipeVersionId: text("recipe_version_id").references(() => recipeVersions.id),
  ownerId: text("owner_id")
    .notNull()
    .references(() => users.id),
  createdAt: createdAt(),
});
export type Document = typeof documents.$inferSelect;

export const documentVersions = sqliteTable(
  "document_versions",
  {
    id: id(),
    documentId: text("document_id")
      .notNull()
      .references(() => documents.id),
    version: integer("version").notNull(),
    status: text("status", { enum: DOCUMENT_STATUSES }).notNull().default("draft"),
    /** Tiptap JSON, validated and sanitised on the server. */
    content: text("content", { mode: "json" }).notNull(),
    /** SHA-256 of the canonical JSON, set when the version is frozen for review. */
    contentHash: text("content_hash"),
    /** Optimistic concurrency: every save must name the counter it read. */
    lockVersion: integer("lock_version").notNull().default(0),
    effectiveDate: text("effective_date"),
    /** Each submission opens a new review round; earlier rounds stay as history. */
    reviewRound: integer("review_round").notNull().default(0),
    routing: text("routing", { enum: ROUTING_MODES }),
    submittedAt: text("submitted_at"),
    approvedAt: text("approved_at"),
    /** Why this version exists, required once the document was ever approved (EU GMP Annex 11 §9). */
    changeReason: text("change_reason"),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: text("updated_at"),
  },
  (t) => [
    uniqueIndex("document_versions_uq").on(t.documentId, t.version),
    // My queue finds the few drafts and versions in review among a library of effective ones.
    index("document_versions_status_idx").on(t.status),
  ],
);
export type DocumentVersion = typeof documentVersions.$inferSelect;

// ── Document review routing ───────────────────────────────────────────────

/**
 * One person's step in the routing of a document version: reviewers sign
 * "reviewed" or send back, the approver signs "approved" or rejects. Steps with
 * the same number run in parallel; a step becomes active (activatedAt) once
 * every earlier step has been decided.
 */
export const documentReviews = sqliteTable(
  "document_reviews",
  {
    id: id(),
    versionId: text("version_id")
      .notNull()
      .references(() => documentVersions.id),
    round: integer("round").notNull(),
    step: integer("step").notNull(),
    role: text("role", { enum: REVIEW_ROLES }).notNull(),
    assigneeId: text("assignee_id")
      .notNull()
      .references(() => users.id),
    activatedAt: text("activated_at"),
    dueAt: text("due_at"),
    decision: text("decision", { enum: REVIEW_DECISIONS }),
    comment: text("comment"),
    decidedAt: text("decided_at"),
    overdueNotifiedAt: text("overdue_notified_at"),
    createdAt: createdAt(),
  },
  (t) => [
    index("document_reviews_version_idx").on(t.versionId, t.round),
    index("document_reviews_assignee_idx").on(t.assigneeId, t.decision),
  ],
);
export type DocumentReview = typeof documentReviews.$inferSelect;
