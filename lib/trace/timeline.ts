import type { RECIPE_VERSION_STATUSES } from "@/db/enums";

export type VersionStatus = (typeof RECIPE_VERSION_STATUSES)[number];

/** One parameter as one recipe version holds it (null when that version has no such parameter). */
export interface ParameterValue {
  name: string;
  stage: string;
  setpoint: number;
  unit: string;
  validatedLow: number | null;
  validatedHigh: number | null;
  critical: boolean;
}

export interface VersionValue {
  versionId: string;
  version: number;
  status: VersionStatus;
  effectiveFrom: string | null;
  effectiveTo: string | null;
  value: ParameterValue | null;
}

/**
 * A span of recipe versions during which the parameter held one value and range.
 * In force: versions that were effective (now effective or superseded), in the
 * order they took effect. Proposals (proposed, withdrawn, draft) never ran on the
 * washer, so each is its own entry and never merges with a period in force.
 */
export interface TimelinePeriod {
  kind: "in_force" | "proposal";
  value: ParameterValue | null;
  /** The first version of the span: the one whose change request introduced this value. */
  introducedBy: VersionValue;
  versions: VersionValue[];
  effectiveFrom: string | null;
  effectiveTo: string | null;
  status: VersionStatus;
  /** What happened to the value at the start of this span, against the span before it. */
  change: "first" | "changed" | "range_changed" | "added" | "removed" | "proposed_change";
}

function same(a: ParameterValue | null, b: ParameterValue | null) {
  if (a === null || b === null) return a === b;
  return (
    a.setpoint === b.setpoint &&
    a.unit === b.unit &&
    a.validatedLow === b.validatedLow &&
    a.validatedHigh === b.validatedHigh
  );
}

function changeKind(
  before: ParameterValue | null | undefined,
  now: ParameterValue | null,
): TimelinePeriod["change"] {
  if (before === undefined) return "first";
  if (before === null) return "added";
  if (now === null) return "removed";
  return before.setpoint === now.setpoint && before.unit === now.unit ? "range_changed" : "changed";
}

/** Every value a parameter has had, oldest first; proposals follow the version they were proposed against. */
export function buildParameterTimeline(
  versions: VersionValue[],
  proposedFrom: Map<string, string | null> = new Map(),
): TimelinePeriod[] {
  const inForce = versions
    .filter((v) => v.status === "effective" || v.status === "superseded")
    .sort(
      (a, b) =>
        (a.effectiveFrom ?? "").localeCompare(b.effectiveFrom ?? "") || a.version - b.version,
    );
  const periods: TimelinePeriod[] = [];
  for (const v of inForce) {
    const last = periods.at(-1);
    if (last && same(last.value, v.value)) {
      last.versions.push(v);
      last.effectiveTo = v.effectiveTo;
      last.status = v.status;
      continue;
    }
    // A version that never held the parameter opens a span only when it removed one.
    if (!last && v.value === null) continue;
    periods.push({
      kind: "in_force",
      value: v.value,
      introducedBy: v,
      versions: [v],
      effectiveFrom: v.effectiveFrom,
      effectiveTo: v.effectiveTo,
      status: v.status,
      change: changeKind(last ? last.value : undefined, v.value),
    });
  }

  const byId = new Map(versions.map((v) => [v.versionId, v]));
  const proposals = versions
    .filter((v) => v.status !== "effective" && v.status !== "superseded")
    .sort((a, b) => a.version - b.version);
  const out = [...periods];
  for (const p of proposals) {
    const fromId = proposedFrom.get(p.versionId) ?? null;
    const from = fromId ? byId.get(fromId) : undefined;
    // A proposal that leaves this parameter as it was is no part of its history.
    if (from ? same(from.value, p.value) : p.value === null) continue;
    const entry: TimelinePeriod = {
      kind: "proposal",
      value: p.value,
      introducedBy: p,
      versions: [p],
      effectiveFrom: null,
      effectiveTo: null,
      status: p.status,
      change: "proposed_change",
    };
    // Place the proposal right after the period in force that holds the version it was proposed against.
    const at = from
      ? out.findIndex(
          (x) => x.kind === "in_force" && x.versions.some((v) => v.versionId === from.versionId),
        )
      : -1;
    let insert = at === -1 ? out.length : at + 1;
    while (insert < out.length && out[insert].kind === "proposal") insert += 1;
    out.splice(insert, 0, entry);
  }
  return out;
}
