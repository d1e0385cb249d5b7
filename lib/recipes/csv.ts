import { toCsv } from "@/lib/csv/to-csv";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { groupStages, type ParameterRow } from "@/lib/plant/csv-master-data";

/**
 * A recipe's stages and parameters as CSV: one row per parameter, its stage named on every row
 * (consecutive rows with the same stage name make one stage, in file order). The columns are the
 * ones the recipe-parameter import reads, so an exported recipe imports back unchanged.
 */
export const RECIPE_CSV_HEADER = [
  "stage",
  "stage_kind",
  "stage_mode",
  "key",
  "name",
  "kind",
  "setpoint",
  "unit",
  "validated_low",
  "validated_high",
  "critical",
];

/** The stages and parameters of a recipe version in the import's columns; a stage with no parameters cannot be written. */
export function recipeToCsv(recipe: Pick<RecipeSnapshot, "stages">): string {
  const rows = recipe.stages.flatMap((s) =>
    s.parameters.map((p) => [
      s.name,
      s.kind,
      s.mode ?? "",
      p.key,
      p.name,
      p.kind,
      p.setpoint,
      p.unit,
      p.validatedLow,
      p.validatedHigh,
      p.critical ? "yes" : "no",
    ]),
  );
  return toCsv(RECIPE_CSV_HEADER, rows);
}

/** An invented four-stage example a plant overwrites with its own values [practice: typical aqueous-washer settings]. */
export const RECIPE_CSV_TEMPLATE = recipeToCsv({
  stages: [
    {
      name: "Ultrasonic wash",
      kind: "wash",
      mode: "ultrasonic",
      parameters: [
        p("wash.temperature", "Bath temperature", "temperature", 60, "°C", 55, 65, true),
        p("wash.time", "Wash time", "time", 300, "s", 240, 360, true),
        p("wash.concentration", "Detergent concentration", "concentration", 3, "%", 2.5, 3.5, true),
      ],
    },
    {
      name: "Spray rinse",
      kind: "rinse",
      mode: "spray",
      parameters: [p("rinse.time", "Rinse time", "time", 90, "s", 60, 120, false)],
    },
    {
      name: "DI rinse",
      kind: "final_rinse",
      mode: "flood",
      parameters: [
        p(
          "final.conductivity",
          "Rinse conductivity limit",
          "conductivity_limit",
          20,
          "µS/cm",
          null,
          30,
          true,
        ),
      ],
    },
    {
      name: "Vacuum dryer",
      kind: "drying",
      mode: "vacuum_drying",
      parameters: [
        p(
          "drying.temperature",
          "Drying temperature",
          "drying_temperature",
          90,
          "°C",
          80,
          100,
          true,
        ),
        p("drying.time", "Drying time", "time", 600, "s", 480, 720, true),
      ],
    },
  ],
});

function p(
  key: string,
  name: string,
  kind: string,
  setpoint: number,
  unit: string,
  validatedLow: number | null,
  validatedHigh: number | null,
  critical: boolean,
) {
  return {
    key,
    name,
    kind: kind as RecipeSnapshot["stages"][number]["parameters"][number]["kind"],
    setpoint,
    unit,
    validatedLow,
    validatedHigh,
    critical,
  };
}

/**
 * The checked rows of a recipe-parameter file as the recipe form's content, and for each stage
 * and parameter the file line it came from, so a refusal of the saved recipe names its line.
 */
export function contentFromRows(rows: ParameterRow[], extra: { detergent: string; notes: string }) {
  const stages = groupStages(rows);
  let line = 2;
  const lines: { stage: number; parameters: number[] }[] = stages.map((s) => {
    const parameters = s.parameters.map(() => line++);
    return { stage: s.line, parameters };
  });
  return {
    content: {
      detergent: extra.detergent,
      notes: extra.notes,
      stages: stages.map((s) => ({
        name: s.name,
        kind: s.kind,
        mode: s.mode,
        parameters: s.parameters.map((r) => ({
          key: r.key,
          name: r.name,
          kind: r.kind,
          setpoint: r.setpoint,
          unit: r.unit,
          validatedLow: r.validatedLow,
          validatedHigh: r.validatedHigh,
          critical: r.critical,
        })),
      })),
    },
    /** File line of a path the recipe schema or service reports ("content.stages.1.parameters.0.unit"). */
    lineOf(path: string): number | null {
      const m = /^(?:content\.)?stages\.(\d+)(?:\.parameters\.(\d+))?/.exec(path);
      if (!m) return null;
      const s = lines[Number(m[1])];
      if (!s) return null;
      return m[2] !== undefined ? (s.parameters[Number(m[2])] ?? s.stage) : s.stage;
    },
  };
}

/** The CSV column a schema field is read from ("validatedLow" → "validated_low", "kind" of a stage → "stage_kind"). */
export function columnOf(path: string): string {
  const parts = path.split(".");
  const field = parts.at(-1) ?? "";
  const onStage = parts.length === 3 || (parts[0] === "content" && parts.length === 4);
  if (onStage) return field === "name" ? "stage" : `stage_${field}`;
  return field.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}
