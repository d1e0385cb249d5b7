import { real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { createdAt, id } from "./columns";

// ── Parts and specifications ──────────────────────────────────────────────

export const cleanlinessSpecs = sqliteTable("cleanliness_specs", {
  id: id(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  /** Per-size-class limits in CCC notation, e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00). */
  ccc: text("ccc").notNull(),
  maxMetallicUm: real("max_metallic_um"),
  maxNonMetallicUm: real("max_non_metallic_um"),
  maxFibreUm: real("max_fibre_um"),
  gravimetricLimitMg: real("gravimetric_limit_mg"),
  gravimetricBasis: text("gravimetric_basis", { enum: ["per_component", "per_1000_cm2"] }),
  minWettingTensionMNm: real("min_wetting_tension_mnm"),
  visualCriteria: text("visual_criteria"),
  drynessCriteria: text("dryness_criteria"),
  createdAt: createdAt(),
});
export type CleanlinessSpec = typeof cleanlinessSpecs.$inferSelect;

export const partFamilies = sqliteTable("part_families", {
  id: id(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  material: text("material").notNull(),
  wettedAreaCm2: real("wetted_area_cm2").notNull(),
  wettedVolumeCm3: real("wetted_volume_cm3"),
  specId: text("spec_id").notNull().references(() => cleanlinessSpecs.id),
  description: text("description"),
  createdAt: createdAt(),
});
export type PartFamily = typeof partFamilies.$inferSelect;
