import { parseCleanlinessSpec, type CleanlinessSpec } from "@/lib/cleanliness/spec";
import type { SizeClassKey } from "@/lib/cleanliness/size-classes";

/** The limits of one specification revision, as compared between revisions. */
export interface SpecLimits {
  ccc: string;
  maxMetallicUm: number | null;
  maxNonMetallicUm: number | null;
  maxFibreUm: number | null;
  gravimetricLimitMg: number | null;
  gravimetricBasis: "per_component" | "per_1000_cm2" | null;
  minWettingTensionMNm: number | null;
  visualCriteria: string | null;
  drynessCriteria: string | null;
  extraRequirements: string | null;
  customerApprovesChanges: boolean;
}

export type LimitChange = {
  field: keyof SpecLimits;
  /** tightened: some part that passed before can fail now; loosened: the reverse; both for CCC regroupings; changed: wording only, judged by a person. */
  direction: "tightened" | "loosened" | "both" | "changed";
  reason: string;
};

export interface SpecComparison {
  changes: LimitChange[];
  /** True when a part that met the old revision may fail the new one: qualified processes must be re-examined. */
  tightens: boolean;
}

type Group = { classes: SizeClassKey[]; joined: boolean; limit: number; text: string };

function groupsOf(spec: CleanlinessSpec): Group[] {
  return spec.groups.map((g) => ({
    classes: [...g.classes],
    joined: g.joined,
    limit: g.limit,
    text: g.text,
  }));
}

/**
 * The largest total count over `classes` that a specification still accepts. Its groups are
 * disjoint, so each may be filled to its own limit at once: a joined group caps the sum of its
 * classes, letters written together cap each class. A class no group names is unlimited.
 */
function largestAccepted(groups: Group[], classes: SizeClassKey[]): number {
  let total = 0;
  for (const key of classes) if (!groups.some((g) => g.classes.includes(key))) return Infinity;
  for (const g of groups) {
    const inside = g.classes.filter((k) => classes.includes(k)).length;
    if (inside === 0) continue;
    total += g.joined ? g.limit : g.limit * inside;
  }
  return total;
}

const label = (g: Group) => g.text;

/**
 * Compares two CCC specifications of the same basis. The new one is tighter when one of its
 * limits is below the largest count the old one accepted over the same classes: that count is
 * then a part that passed before and fails now (ISO 16232:2018 / VDA 19.1:2015 notation; the
 * comparison itself is set logic, not from the standard).
 */
export function compareCcc(oldText: string, newText: string): LimitChange | null {
  const a = parseCleanlinessSpec(oldText);
  const b = parseCleanlinessSpec(newText);
  if (a.text === b.text) return null;
  if (a.basis !== b.basis) {
    return {
      field: "ccc",
      direction: "tightened",
      reason: `Basis changed from ${a.prefix}(…) to ${b.prefix}(…): the limits cannot be compared, so the change is treated as tightening.`,
    };
  }
  const oldGroups = groupsOf(a);
  const newGroups = groupsOf(b);
  const tighter = newGroups
    .filter((g) => g.limit < largestAccepted(oldGroups, g.classes))
    .map(label);
  const looser = oldGroups
    .filter((g) => g.limit < largestAccepted(newGroups, g.classes))
    .map(label);
  if (tighter.length && looser.length)
    return {
      field: "ccc",
      direction: "both",
      reason: `Cleanliness code ${a.text} → ${b.text}: tighter at ${tighter.join(", ")}; looser at ${looser.join(", ")}.`,
    };
  if (tighter.length)
    return {
      field: "ccc",
      direction: "tightened",
      reason: `Cleanliness code ${a.text} → ${b.text}: tighter at ${tighter.join(", ")}.`,
    };
  if (looser.length)
    return {
      field: "ccc",
      direction: "loosened",
      reason: `Cleanliness code ${a.text} → ${b.text}: looser at ${looser.join(", ")}.`,
    };
  return {
    field: "ccc",
    direction: "changed",
    reason: `Cleanliness code rewritten ${a.text} → ${b.text} with the same limits.`,
  };
}

/** A maximum: lower is tighter, and a limit where there was none is tighter. */
function compareMax(
  field: keyof SpecLimits,
  name: string,
  unit: string,
  a: number | null,
  b: number | null,
): LimitChange | null {
  if (a === b) return null;
  const show = (v: number | null) => (v === null ? "no limit" : `${v} ${unit}`);
  const tighter = b !== null && (a === null || b < a);
  return {
    field,
    direction: tighter ? "tightened" : "loosened",
    reason: `${name} ${show(a)} → ${show(b)}.`,
  };
}

/** A minimum (wetting tension): higher is tighter. */
function compareMin(
  field: keyof SpecLimits,
  name: string,
  unit: string,
  a: number | null,
  b: number | null,
): LimitChange | null {
  if (a === b) return null;
  const show = (v: number | null) => (v === null ? "no limit" : `${v} ${unit}`);
  const tighter = b !== null && (a === null || b > a);
  return {
    field,
    direction: tighter ? "tightened" : "loosened",
    reason: `${name} ${show(a)} → ${show(b)}.`,
  };
}

function compareText(
  field: keyof SpecLimits,
  name: string,
  a: string | null,
  b: string | null,
): LimitChange | null {
  if ((a ?? "").trim() === (b ?? "").trim()) return null;
  return {
    field,
    direction: "changed",
    reason: `${name} reworded: "${a ?? ""}" → "${b ?? ""}"; judge whether it asks more of the process.`,
  };
}

const BASIS_WORDS = { per_component: "per part", per_1000_cm2: "per 1000 cm²" } as const;

/** What a new specification revision changes against the one it supersedes, limit by limit. */
export function compareSpecRevisions(oldSpec: SpecLimits, newSpec: SpecLimits): SpecComparison {
  const changes: (LimitChange | null)[] = [compareCcc(oldSpec.ccc, newSpec.ccc)];
  changes.push(
    compareMax(
      "maxMetallicUm",
      "Largest metallic particle",
      "µm",
      oldSpec.maxMetallicUm,
      newSpec.maxMetallicUm,
    ),
    compareMax(
      "maxNonMetallicUm",
      "Largest non-metallic particle",
      "µm",
      oldSpec.maxNonMetallicUm,
      newSpec.maxNonMetallicUm,
    ),
    compareMax("maxFibreUm", "Largest fibre", "µm", oldSpec.maxFibreUm, newSpec.maxFibreUm),
  );
  if (
    oldSpec.gravimetricLimitMg !== null &&
    newSpec.gravimetricLimitMg !== null &&
    oldSpec.gravimetricBasis !== newSpec.gravimetricBasis
  ) {
    changes.push({
      field: "gravimetricLimitMg",
      direction: "tightened",
      reason: `Gravimetric limit moved from ${oldSpec.gravimetricLimitMg} mg ${BASIS_WORDS[oldSpec.gravimetricBasis ?? "per_component"]} to ${newSpec.gravimetricLimitMg} mg ${BASIS_WORDS[newSpec.gravimetricBasis ?? "per_component"]}: not comparable without a part's area, so treated as tightening.`,
    });
  } else {
    changes.push(
      compareMax(
        "gravimetricLimitMg",
        "Gravimetric limit",
        "mg",
        oldSpec.gravimetricLimitMg,
        newSpec.gravimetricLimitMg,
      ),
    );
  }
  changes.push(
    compareMin(
      "minWettingTensionMNm",
      "Minimum wetting tension",
      "mN/m",
      oldSpec.minWettingTensionMNm,
      newSpec.minWettingTensionMNm,
    ),
    compareText(
      "visualCriteria",
      "Visual criteria",
      oldSpec.visualCriteria,
      newSpec.visualCriteria,
    ),
    compareText(
      "drynessCriteria",
      "Dryness criteria",
      oldSpec.drynessCriteria,
      newSpec.drynessCriteria,
    ),
    compareText(
      "extraRequirements",
      "Extra requirements",
      oldSpec.extraRequirements,
      newSpec.extraRequirements,
    ),
  );
  if (oldSpec.customerApprovesChanges !== newSpec.customerApprovesChanges) {
    changes.push({
      field: "customerApprovesChanges",
      direction: newSpec.customerApprovesChanges ? "tightened" : "loosened",
      reason: newSpec.customerApprovesChanges
        ? "The customer now approves process changes."
        : "The customer no longer approves process changes.",
    });
  }
  const list = changes.filter((c): c is LimitChange => c !== null);
  return {
    changes: list,
    tightens: list.some((c) => c.direction === "tightened" || c.direction === "both"),
  };
}
