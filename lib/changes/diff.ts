import { diffWords } from "diff";
import type { ParameterKind } from "@/db/enums";
import { convert } from "@/lib/recipes/units";

export interface ParameterSnapshot {
  key: string;
  name: string;
  kind: ParameterKind;
  setpoint: number;
  unit: string;
  validatedLow: number | null;
  validatedHigh: number | null;
  critical: boolean;
}

export interface StageSnapshot {
  name: string;
  kind: string;
  mode: string | null;
  parameters: ParameterSnapshot[];
}

/** A recipe version as compared: what the washer is told to do, and the free text beside it. */
export interface RecipeSnapshot {
  detergent: string | null;
  notes: string | null;
  stages: StageSnapshot[];
}

export type Impact = "editorial" | "minor" | "major";
export const IMPACT_ORDER: Impact[] = ["editorial", "minor", "major"];
export function maxImpact(...impacts: Impact[]): Impact {
  return impacts.reduce<Impact>(
    (a, b) => (IMPACT_ORDER.indexOf(b) > IMPACT_ORDER.indexOf(a) ? b : a),
    "editorial",
  );
}

export interface ParameterRow {
  key: string;
  name: string;
  kind: ParameterKind;
  stage: string;
  /** The kind of stage the parameter sits in, so the matrix can key by stage and kind. */
  stageKind?: string;
  change: "unchanged" | "changed" | "added" | "removed";
  old: ParameterSnapshot | null;
  new: ParameterSnapshot | null;
  /** The new setpoint against the effective version's validated range, in the old unit. */
  position: "inside" | "outside" | null;
  impact: Impact;
  reasons: string[];
}

export interface StageRow {
  stage: string;
  kind: string;
  change: "added" | "removed" | "mode_changed" | "renamed";
  oldMode: string | null;
  newMode: string | null;
  impact: Impact;
  reason: string;
}

export interface TextRow {
  field: "detergent" | "notes";
  old: string;
  new: string;
  parts: { value: string; added: boolean; removed: boolean }[];
  impact: Impact;
  reason: string;
}

export interface RecipeDiff {
  parameters: ParameterRow[];
  stages: StageRow[];
  texts: TextRow[];
  impact: Impact;
}

/** Stages are matched by kind and their order among stages of that kind (the second rinse stays the second rinse). */
function stageKeys(stages: StageSnapshot[]) {
  const seen = new Map<string, number>();
  return stages.map((s) => {
    const n = (seen.get(s.kind) ?? 0) + 1;
    seen.set(s.kind, n);
    return { key: `${s.kind}#${n}`, stage: s };
  });
}

function within(value: number, low: number | null, high: number | null) {
  return (low === null || value >= low) && (high === null || value <= high);
}

function describeRange(low: number | null, high: number | null, unit: string) {
  if (low === null && high === null) return "no validated range";
  return `${low ?? "−∞"}–${high ?? "∞"} ${unit}`;
}

/**
 * One parameter old → new, classified as product.md "Change impact" says:
 * nothing but wording → editorial; setpoint moved inside the validated range
 * (or the range narrowed within it) → minor; setpoint or range outside the
 * validated range → major. An added or removed parameter has no proven range → major.
 */
export function compareParameter(
  oldP: ParameterSnapshot | null,
  newP: ParameterSnapshot | null,
  stage: string,
): ParameterRow {
  const base = newP ?? oldP!;
  const row: ParameterRow = {
    key: base.key,
    name: base.name,
    kind: base.kind,
    stage,
    change: "unchanged",
    old: oldP,
    new: newP,
    position: null,
    impact: "editorial",
    reasons: [],
  };
  if (!oldP)
    return {
      ...row,
      change: "added",
      impact: "major",
      reasons: ["New parameter: no validated range proven yet."],
    };
  if (!newP)
    return {
      ...row,
      change: "removed",
      impact: "major",
      reasons: ["Parameter removed from the recipe."],
    };

  const reasons: string[] = [];
  let impact: Impact = "editorial";
  const raise = (to: Impact, reason: string) => {
    impact = maxImpact(impact, to);
    reasons.push(reason);
  };
  // Compare in the old unit so "4 min" against "180–300 s" means what it says.
  const toOld = (v: number | null) => (v === null ? null : convert(v, newP.unit, oldP.unit));
  const setpoint = toOld(newP.setpoint);
  const low = toOld(newP.validatedLow);
  const high = toOld(newP.validatedHigh);
  const unitsComparable =
    setpoint !== null &&
    (newP.validatedLow === null || low !== null) &&
    (newP.validatedHigh === null || high !== null);

  if (!unitsComparable) {
    return {
      ...row,
      change: "changed",
      impact: "major",
      reasons: [
        `Unit changed from ${oldP.unit} to ${newP.unit}: the values cannot be compared with the validated range.`,
      ],
    };
  }
  const position = within(setpoint, oldP.validatedLow, oldP.validatedHigh) ? "inside" : "outside";
  if (setpoint !== oldP.setpoint) {
    if (position === "inside")
      raise(
        "minor",
        `Setpoint ${oldP.setpoint} → ${setpoint} ${oldP.unit}, inside the validated range ${describeRange(oldP.validatedLow, oldP.validatedHigh, oldP.unit)}.`,
      );
    else
      raise(
        "major",
        `Setpoint ${oldP.setpoint} → ${setpoint} ${oldP.unit}, outside the validated range ${describeRange(oldP.validatedLow, oldP.validatedHigh, oldP.unit)}.`,
      );
  }
  if (low !== oldP.validatedLow || high !== oldP.validatedHigh) {
    const widened =
      (low === null
        ? oldP.validatedLow !== null
        : oldP.validatedLow !== null && low < oldP.validatedLow) ||
      (high === null
        ? oldP.validatedHigh !== null
        : oldP.validatedHigh !== null && high > oldP.validatedHigh);
    const from = describeRange(oldP.validatedLow, oldP.validatedHigh, oldP.unit);
    const to = describeRange(low, high, oldP.unit);
    if (widened)
      raise(
        "major",
        `Validated range widened from ${from} to ${to}: the new part of the range is not proven.`,
      );
    else raise("minor", `Validated range narrowed from ${from} to ${to}, within the proven range.`);
  }
  if (newP.unit !== oldP.unit)
    raise(
      "editorial",
      `Unit written as ${newP.unit} instead of ${oldP.unit}; values converted for comparison.`,
    );
  if (newP.critical !== oldP.critical)
    raise("minor", newP.critical ? "Now marked critical." : "No longer marked critical.");
  if (newP.name !== oldP.name) raise("editorial", `Renamed from "${oldP.name}".`);
  const changed = reasons.length > 0;
  return { ...row, change: changed ? "changed" : "unchanged", position, impact, reasons };
}

function textRow(
  field: TextRow["field"],
  oldText: string | null,
  newText: string | null,
): TextRow | null {
  const a = (oldText ?? "").trim();
  const b = (newText ?? "").trim();
  if (a === b) return null;
  const parts = diffWords(a, b).map((p) => ({
    value: p.value,
    added: !!p.added,
    removed: !!p.removed,
  }));
  if (field === "detergent")
    return {
      field,
      old: a,
      new: b,
      parts,
      impact: "major",
      reason: "A new detergent changes the chemistry of the wash.",
    };
  return { field, old: a, new: b, parts, impact: "editorial", reason: "Wording only." };
}

/** The parameter diff of a proposed recipe version against the effective one, with the overall impact. */
export function diffRecipes(oldV: RecipeSnapshot, newV: RecipeSnapshot): RecipeDiff {
  const oldStages = stageKeys(oldV.stages);
  const newStages = stageKeys(newV.stages);
  const stages: StageRow[] = [];
  for (const { key, stage } of oldStages) {
    const match = newStages.find((s) => s.key === key)?.stage;
    if (!match) {
      stages.push({
        stage: stage.name,
        kind: stage.kind,
        change: "removed",
        oldMode: stage.mode,
        newMode: null,
        impact: "major",
        reason: `Stage "${stage.name}" removed.`,
      });
    } else if (match.mode !== stage.mode) {
      stages.push({
        stage: match.name,
        kind: match.kind,
        change: "mode_changed",
        oldMode: stage.mode,
        newMode: match.mode,
        impact: "major",
        reason: `Mode of "${match.name}" changed: ${stage.mode ?? "none"} removed, ${match.mode ?? "none"} added.`,
      });
    } else if (match.name !== stage.name) {
      stages.push({
        stage: match.name,
        kind: match.kind,
        change: "renamed",
        oldMode: stage.mode,
        newMode: match.mode,
        impact: "editorial",
        reason: `Stage renamed from "${stage.name}".`,
      });
    }
  }
  for (const { key, stage } of newStages) {
    if (!oldStages.some((s) => s.key === key)) {
      stages.push({
        stage: stage.name,
        kind: stage.kind,
        change: "added",
        oldMode: null,
        newMode: stage.mode,
        impact: "major",
        reason: `Stage "${stage.name}" added.`,
      });
    }
  }

  const oldParams = new Map(
    oldV.stages.flatMap((s) =>
      s.parameters.map((p) => [p.key, { p, stage: s.name, stageKind: s.kind }] as const),
    ),
  );
  const newParams = new Map(
    newV.stages.flatMap((s) =>
      s.parameters.map((p) => [p.key, { p, stage: s.name, stageKind: s.kind }] as const),
    ),
  );
  const parameters: ParameterRow[] = [];
  for (const [key, { p, stage, stageKind }] of oldParams) {
    const next = newParams.get(key);
    parameters.push({
      ...compareParameter(p, next?.p ?? null, next?.stage ?? stage),
      stageKind: next?.stageKind ?? stageKind,
    });
  }
  for (const [key, { p, stage, stageKind }] of newParams)
    if (!oldParams.has(key)) parameters.push({ ...compareParameter(null, p, stage), stageKind });

  const texts = [
    textRow("detergent", oldV.detergent, newV.detergent),
    textRow("notes", oldV.notes, newV.notes),
  ].filter((t): t is TextRow => t !== null);
  const impact = maxImpact(
    ...parameters.map((p) => p.impact),
    ...stages.map((s) => s.impact),
    ...texts.map((t) => t.impact),
  );
  return { parameters, stages, texts, impact };
}
