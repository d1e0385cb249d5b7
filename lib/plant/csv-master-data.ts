import Papa from "papaparse";
import { z } from "zod";
import { formulaProblem } from "@/lib/evidence/files";
import { parameterSchema } from "@/lib/schemas/change";
import { partFamilySchema } from "@/lib/schemas/part-family";
import { specSchema } from "@/lib/schemas/spec";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";
import { ownRangeProblem, parameterProblems } from "@/lib/recipes/units";
import { processOrderProblems } from "./equipment";

/**
 * Our CSV formats for bulk onboarding: a header row naming these columns (any order, any case,
 * spaces or hyphens for underscores), comma or semicolon separated, UTF-8. Each row is checked
 * with the same schema as the entry form; a file with any bad row imports nothing.
 */
type Field = { key: string; label: string; aliases?: string[] };

const PART_FAMILY_FIELDS: Field[] = [
  { key: "code", label: "Family code", aliases: ["family_code", "part_family"] },
  { key: "name", label: "Name" },
  {
    key: "part_numbers",
    label: "Part numbers (separated by ; or ,)",
    aliases: ["part_number", "part_nos"],
  },
  { key: "material", label: "Material" },
  { key: "wetted_area_cm2", label: "Wetted area (cm²)", aliases: ["wetted_area", "area_cm2"] },
  {
    key: "wetted_area_method",
    label: "How the area was found (cad_model, measured, calculated, estimated)",
    aliases: ["area_method"],
  },
  { key: "wetted_area_note", label: "Area note" },
  { key: "wetted_volume_cm3", label: "Wetted volume (cm³)", aliases: ["wetted_volume"] },
  { key: "drawing_number", label: "Drawing number", aliases: ["drawing"] },
  { key: "drawing_revision", label: "Drawing revision" },
  { key: "customer", label: "Customer" },
  { key: "spec_code", label: "Specification code", aliases: ["specification", "spec"] },
  { key: "description", label: "Description" },
];

const SPEC_FIELDS: Field[] = [
  { key: "code", label: "Register code", aliases: ["spec_code"] },
  { key: "name", label: "Title", aliases: ["title"] },
  { key: "customer", label: "Customer" },
  {
    key: "document_number",
    label: "Customer document number",
    aliases: ["document", "doc_number"],
  },
  { key: "revision", label: "Revision", aliases: ["rev"] },
  {
    key: "ccc",
    label: "Cleanliness code specification",
    aliases: ["cleanliness_code", "ccc_spec"],
  },
  { key: "max_metallic_um", label: "Largest metallic particle (µm)" },
  { key: "max_non_metallic_um", label: "Largest non-metallic particle (µm)" },
  { key: "max_fibre_um", label: "Largest fibre (µm)", aliases: ["max_fiber_um"] },
  { key: "gravimetric_limit_mg", label: "Gravimetric limit (mg)" },
  { key: "gravimetric_basis", label: "Gravimetric basis (per_component or per_1000_cm2)" },
  { key: "min_wetting_tension_mnm", label: "Minimum wetting tension (mN/m)" },
  { key: "visual_criteria", label: "Visual criteria" },
  { key: "dryness_criteria", label: "Dryness criteria" },
  { key: "extra_requirements", label: "Extra requirements" },
  { key: "customer_approves_changes", label: "Customer approves changes (yes/no)" },
];

const PARAMETER_FIELDS: Field[] = [
  { key: "stage", label: "Stage name", aliases: ["stage_name"] },
  { key: "stage_kind", label: "Stage kind (wash, rinse, final_rinse, drying, other)" },
  {
    key: "stage_mode",
    label: "Stage mode (ultrasonic, spray, injection, flood, …)",
    aliases: ["mode"],
  },
  { key: "key", label: "Parameter key (e.g. wash.temperature)", aliases: ["parameter_key"] },
  { key: "name", label: "Parameter name", aliases: ["parameter"] },
  { key: "kind", label: "Parameter kind", aliases: ["parameter_kind"] },
  { key: "setpoint", label: "Setpoint" },
  { key: "unit", label: "Unit" },
  { key: "validated_low", label: "Validated low", aliases: ["low", "min"] },
  { key: "validated_high", label: "Validated high", aliases: ["high", "max"] },
  { key: "critical", label: "Critical (yes/no)" },
];

const yes = (v: string | undefined) => (v ? /^(y|yes|true|1|x)$/i.test(v.trim()) : false);

const partFamilyRow = partFamilySchema.omit({ specId: true }).extend({
  specCode: z
    .string({ error: "Give the specification code." })
    .trim()
    .min(1, "Give the specification code."),
});
const specRow = specSchema;
const parameterRow = parameterSchema.extend({
  stage: z.string({ error: "Name the stage." }).trim().min(2, "Name the stage.").max(120),
  stageKind: z.enum(STAGE_KINDS, {
    error: "Stage kind is wash, rinse, final_rinse, drying or other.",
  }),
  stageMode: z.preprocess(
    (v) => (v === "" || v === undefined ? null : v),
    z.enum(STAGE_MODES, { error: "Not a stage mode we know." }).nullable(),
  ),
});

export type PartFamilyRow = z.output<typeof partFamilyRow>;
export type SpecRow = z.output<typeof specRow>;
export type ParameterRow = z.output<typeof parameterRow>;

type Get = (key: string) => string | undefined;
const FORMATS = {
  part_families: {
    fields: PART_FAMILY_FIELDS,
    needs: ["code", "name", "material", "wetted_area_cm2", "spec_code"],
    identity: "code",
    schema: partFamilyRow,
    toInput: (get: Get) => ({
      code: get("code"),
      name: get("name"),
      partNumbers: get("part_numbers"),
      material: get("material"),
      wettedAreaCm2: get("wetted_area_cm2"),
      wettedAreaMethod: get("wetted_area_method") || "estimated",
      wettedAreaNote: get("wetted_area_note"),
      wettedVolumeCm3: get("wetted_volume_cm3"),
      drawingNumber: get("drawing_number"),
      drawingRevision: get("drawing_revision"),
      customer: get("customer"),
      specCode: get("spec_code"),
      description: get("description"),
    }),
  },
  specifications: {
    fields: SPEC_FIELDS,
    needs: ["code", "name", "customer", "document_number", "revision", "ccc"],
    identity: "code",
    schema: specRow,
    toInput: (get: Get) => ({
      code: get("code"),
      name: get("name"),
      customer: get("customer"),
      documentNumber: get("document_number"),
      revision: get("revision"),
      sourceFileId: "",
      partFamilyIds: [],
      ccc: get("ccc"),
      maxMetallicUm: get("max_metallic_um"),
      maxNonMetallicUm: get("max_non_metallic_um"),
      maxFibreUm: get("max_fibre_um"),
      gravimetricLimitMg: get("gravimetric_limit_mg"),
      gravimetricBasis: get("gravimetric_basis"),
      minWettingTensionMNm: get("min_wetting_tension_mnm"),
      visualCriteria: get("visual_criteria"),
      drynessCriteria: get("dryness_criteria"),
      extraRequirements: get("extra_requirements"),
      customerApprovesChanges: yes(get("customer_approves_changes")),
    }),
  },
  recipe_parameters: {
    fields: PARAMETER_FIELDS,
    needs: ["stage", "stage_kind", "key", "name", "kind", "setpoint", "unit"],
    identity: "key",
    schema: parameterRow,
    toInput: (get: Get) => ({
      stage: get("stage"),
      stageKind: get("stage_kind"),
      stageMode: get("stage_mode"),
      key: get("key"),
      name: get("name"),
      kind: get("kind"),
      setpoint: get("setpoint") ?? "",
      unit: get("unit") ?? "",
      validatedLow: get("validated_low") ?? "",
      validatedHigh: get("validated_high") ?? "",
      critical: yes(get("critical")),
    }),
  },
} as const;

export type MasterDataKind = keyof typeof FORMATS;
type RowOf<K extends MasterDataKind> = K extends "part_families"
  ? PartFamilyRow
  : K extends "specifications"
    ? SpecRow
    : ParameterRow;

export interface MasterDataResult<K extends MasterDataKind> {
  headers: string[];
  /** Every row, only when the whole file is valid: an import is all or nothing. */
  rows: RowOf<K>[];
  /** Line in the file (the header is line 1) and what is wrong there. */
  errors: { line: number; message: string }[];
  fileErrors: string[];
}

/** Our field → the file's column header. */
export type MasterDataMapping = Record<string, string | undefined>;

const norm = (h: string) =>
  h
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, "_");

/** Maps the file's headers to our fields by name and known aliases, for the column-mapping screen to start from. */
export function autoMapMasterData(kind: MasterDataKind, headers: string[]): MasterDataMapping {
  const mapping: MasterDataMapping = {};
  for (const f of FORMATS[kind].fields) {
    const hit = headers.find((h) => norm(h) === f.key || (f.aliases ?? []).includes(norm(h)));
    if (hit !== undefined) mapping[f.key] = hit;
  }
  return mapping;
}

export const masterDataFields = (kind: MasterDataKind) => FORMATS[kind].fields;

/** Reads a master-data CSV; the caller saves nothing unless `errors` and `fileErrors` are empty. */
export function parseMasterDataCsv<K extends MasterDataKind>(
  kind: K,
  text: string,
  opts: { mapping?: MasterDataMapping; maxRows?: number } = {},
): MasterDataResult<K> {
  const format = FORMATS[kind];
  const result: MasterDataResult<K> = { headers: [], rows: [], errors: [], fileErrors: [] };
  const parsed = Papa.parse<Record<string, string>>(text, {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim(),
  });
  result.headers = parsed.meta.fields ?? [];
  if (result.headers.length === 0) {
    result.fileErrors.push("The file is empty: it has no header row and no data.");
    return result;
  }
  const mapping = opts.mapping ?? autoMapMasterData(kind, result.headers);
  for (const need of format.needs) {
    if (!mapping[need])
      result.fileErrors.push(
        `No column holds ${format.fields.find((f) => f.key === need)!.label.toLowerCase()}: name one "${need}" or map it.`,
      );
  }
  for (const [key, header] of Object.entries(mapping))
    if (header && !result.headers.includes(header))
      result.fileErrors.push(`The column "${header}" chosen for ${key} is not in the file.`);
  if (parsed.data.length === 0)
    result.fileErrors.push("The file has a header row but no data rows.");
  if (opts.maxRows && parsed.data.length > opts.maxRows)
    result.fileErrors.push(`The file has more than ${opts.maxRows} rows; split it.`);
  if (result.fileErrors.length) return result;

  const rows: RowOf<K>[] = [];
  const seen = new Map<string, number>();
  parsed.data.forEach((row, i) => {
    const line = i + 2;
    const fail = (message: string) => result.errors.push({ line, message });
    for (const [column, cell] of Object.entries(row)) {
      // A negative number is data, not a formula; anything else starting like one is refused.
      const mark = typeof cell === "string" && !/^\s*-?\d/.test(cell) ? formulaProblem(cell) : null;
      if (mark)
        fail(
          `Column "${column}" starts with "${mark}", which a spreadsheet would run as a formula.`,
        );
    }
    const get: Get = (key) => (mapping[key] ? row[mapping[key]!] : undefined);
    const checked = (format.schema as unknown as z.ZodType<RowOf<K>>).safeParse(
      format.toInput(get),
    );
    if (!checked.success) {
      for (const issue of checked.error.issues)
        fail(`${issue.path.join(".") || "row"}: ${issue.message}`);
      return;
    }
    const data = checked.data;
    if (kind === "recipe_parameters") {
      const p = data as ParameterRow;
      for (const problem of parameterProblems({ ...p, stageKind: p.stageKind }))
        fail(`${problem.field}: ${problem.message}`);
      const own = ownRangeProblem(p);
      if (own) fail(`${own.field}: ${own.message}`);
    }
    const id = String((data as Record<string, unknown>)[format.identity]).toLowerCase();
    const earlier = seen.get(id);
    if (earlier !== undefined)
      fail(
        `${(data as Record<string, unknown>)[format.identity]} appears twice in the file (first on line ${earlier}).`,
      );
    else seen.set(id, line);
    rows.push(data);
  });
  if (kind === "recipe_parameters" && result.errors.length === 0) {
    const stages = groupStages(rows as ParameterRow[]);
    for (const problem of processOrderProblems(stages))
      result.errors.push({ line: stages[problem.index].line, message: problem.message });
  }
  if (result.errors.length === 0) result.rows = rows;
  return result;
}

/** Consecutive rows with the same stage name make one stage, in the order the file gives them. */
export function groupStages(rows: ParameterRow[]) {
  const stages: {
    name: string;
    kind: ParameterRow["stageKind"];
    mode: ParameterRow["stageMode"];
    line: number;
    parameters: ParameterRow[];
  }[] = [];
  rows.forEach((r, i) => {
    const last = stages.at(-1);
    if (last && last.name === r.stage) last.parameters.push(r);
    else
      stages.push({
        name: r.stage,
        kind: r.stageKind,
        mode: r.stageMode,
        line: i + 2,
        parameters: [r],
      });
  });
  return stages;
}

/** The fields a file of this kind cannot do without, for the column-mapping screen. */
export const masterDataNeeds = (kind: MasterDataKind): readonly string[] => FORMATS[kind].needs;
