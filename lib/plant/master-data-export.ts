import { toCsv } from "@/lib/csv/to-csv";

/**
 * Master data out, in the column names our CSV import reads (lib/plant/csv-master-data.ts), so an
 * exported file can be edited and imported into another installation as it is.
 */
export interface FamilyExport {
  code: string;
  name: string;
  partNumbers: string[];
  material: string;
  wettedAreaCm2: number;
  wettedAreaMethod: string | null;
  wettedAreaNote: string | null;
  wettedVolumeCm3: number | null;
  drawingNumber: string | null;
  drawingRevision: string | null;
  customer: string | null;
  specCode: string;
  specRevision: string;
  description: string | null;
}

export interface SpecExport {
  code: string;
  name: string;
  customer: string | null;
  documentNumber: string | null;
  revision: string;
  status: string;
  ccc: string;
  maxMetallicUm: number | null;
  maxNonMetallicUm: number | null;
  maxFibreUm: number | null;
  gravimetricLimitMg: number | null;
  gravimetricBasis: string | null;
  minWettingTensionMNm: number | null;
  visualCriteria: string | null;
  drynessCriteria: string | null;
  extraRequirements: string | null;
  customerApprovesChanges: boolean;
}

export interface CombinationExport {
  recipeCode: string;
  recipeVersion: number;
  recipeVersionStatus: string;
  familyCode: string;
  basis: string | null;
  qualifiedOn: string;
  intervalMonths: number;
  dueOn: string;
}

export const EXPORT_KINDS = ["part_families", "specifications", "combinations"] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

export function familiesCsv(rows: FamilyExport[]) {
  return toCsv(
    [
      "code",
      "name",
      "part_numbers",
      "material",
      "wetted_area_cm2",
      "wetted_area_method",
      "wetted_area_note",
      "wetted_volume_cm3",
      "drawing_number",
      "drawing_revision",
      "customer",
      "spec_code",
      "spec_revision",
      "description",
    ],
    rows.map((f) => [
      f.code,
      f.name,
      f.partNumbers.join("; "),
      f.material,
      f.wettedAreaCm2,
      f.wettedAreaMethod,
      f.wettedAreaNote,
      f.wettedVolumeCm3,
      f.drawingNumber,
      f.drawingRevision,
      f.customer,
      f.specCode,
      f.specRevision,
      f.description,
    ]),
  );
}

export function specsCsv(rows: SpecExport[]) {
  return toCsv(
    [
      "code",
      "name",
      "customer",
      "document_number",
      "revision",
      "status",
      "ccc",
      "max_metallic_um",
      "max_non_metallic_um",
      "max_fibre_um",
      "gravimetric_limit_mg",
      "gravimetric_basis",
      "min_wetting_tension_mnm",
      "visual_criteria",
      "dryness_criteria",
      "extra_requirements",
      "customer_approves_changes",
    ],
    rows.map((s) => [
      s.code,
      s.name,
      s.customer,
      s.documentNumber,
      s.revision,
      s.status,
      s.ccc,
      s.maxMetallicUm,
      s.maxNonMetallicUm,
      s.maxFibreUm,
      s.gravimetricLimitMg,
      s.gravimetricBasis,
      s.minWettingTensionMNm,
      s.visualCriteria,
      s.drynessCriteria,
      s.extraRequirements,
      s.customerApprovesChanges ? "yes" : "no",
    ]),
  );
}

export function combinationsCsv(rows: CombinationExport[]) {
  return toCsv(
    [
      "recipe_code",
      "recipe_version",
      "recipe_version_status",
      "family_code",
      "basis",
      "qualified_on",
      "interval_months",
      "due_on",
    ],
    rows.map((c) => [
      c.recipeCode,
      c.recipeVersion,
      c.recipeVersionStatus,
      c.familyCode,
      c.basis,
      c.qualifiedOn,
      c.intervalMonths,
      c.dueOn,
    ]),
  );
}
