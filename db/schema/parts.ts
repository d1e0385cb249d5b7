import { index, sqliteTable, text, real, uniqueIndex } from "drizzle-orm/sqlite-core";
import { SPEC_STATUSES, WETTED_AREA_METHODS } from "../enums";
import { bool, createdAt, id } from "./columns";

// ── Parts and specifications ──────────────────────────────────────────────

/**
 * One revision of a customer's cleanliness specification. `code` names the specification in
 * our register across its revisions; a new revision is a new row that supersedes the one before,
 * so runs tested against an earlier revision keep pointing at the limits they were judged by.
 */
export const cleanlinessSpecs = sqliteTable(
  "cleanliness_specs",
  {
    id: id(),
    code: text("code").notNull(),
    name: text("name").notNull(),
    customer: text("customer"),
    documentNumber: text("document_number"),
    revision: text("revision").notNull().default("1"),
    status: text("status", { enum: SPEC_STATUSES }).notNull().default("in_force"),
    /** The revision this one replaced; null for the first revision. */
    supersedesId: text("supersedes_id"),
    supersededAt: text("superseded_at"),
    /** The customer's document as uploaded (an evidence file, stored by SHA-256). */
    sourceFileId: text("source_file_id"),
    /** Per-size-class limits in CCC notation, e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00); the prefix says per 1000 cm² (A) or per component (N). */
    ccc: text("ccc").notNull(),
    maxMetallicUm: real("max_metallic_um"),
    maxNonMetallicUm: real("max_non_metallic_um"),
    maxFibreUm: real("max_fibre_um"),
    gravimetricLimitMg: real("gravimetric_limit_mg"),
    gravimetricBasis: text("gravimetric_basis", { enum: ["per_component", "per_1000_cm2"] }),
    minWettingTensionMNm: real("min_wetting_tension_mnm"),
    visualCriteria: text("visual_criteria"),
    drynessCriteria: text("dryness_criteria"),
    extraRequirements: text("extra_requirements"),
    /** The customer must approve any process change before it is implemented. */
    customerApprovesChanges: bool("customer_approves_changes").notNull().default(false),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("cleanliness_specs_code_revision_uq").on(t.code, t.revision),
    index("cleanliness_specs_status_idx").on(t.status),
  ],
);
export type CleanlinessSpec = typeof cleanlinessSpecs.$inferSelect;

export const partFamilies = sqliteTable("part_families", {
  id: id(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  /** The customer part numbers this family covers. */
  partNumbers: text("part_numbers", { mode: "json" }).$type<string[]>().notNull().default([]),
  material: text("material").notNull(),
  wettedAreaCm2: real("wetted_area_cm2").notNull(),
  /** How the wetted area was found, so an auditor can judge the per-area limits built on it. */
  wettedAreaMethod: text("wetted_area_method", { enum: WETTED_AREA_METHODS }),
  wettedAreaNote: text("wetted_area_note"),
  wettedVolumeCm3: real("wetted_volume_cm3"),
  drawingNumber: text("drawing_number"),
  drawingRevision: text("drawing_revision"),
  customer: text("customer"),
  /** The specification revision in force for this family; moves to each new revision. */
  specId: text("spec_id")
    .notNull()
    .references(() => cleanlinessSpecs.id),
  description: text("description"),
  createdAt: createdAt(),
  updatedAt: text("updated_at"),
});
export type PartFamily = typeof partFamilies.$inferSelect;
