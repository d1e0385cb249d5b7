import type { STAGE_KINDS } from "@/db/enums";
import { equipmentImpact, type EquipmentChange, type EquipmentStage } from "@/lib/plant/equipment";
import type { TestType } from "@/lib/recipes/test-types";
import type { LimitChange, SpecComparison, SpecLimits } from "@/lib/specs/compare";
import type { Impact } from "./diff";
import {
  DEFAULT_MIN_CYCLES,
  samplesFor,
  type ImpactTrigger,
  type MatrixRow,
  type RequiredTest,
} from "./requalification";

/**
 * What a change request changes besides the recipe: a washer's equipment, or the customer
 * specification the recipe's part families are cleaned to. Each brings its own impact, its
 * matrix triggers and the tests it calls for directly.
 */
export interface SubjectAssessment {
  impact: Impact;
  triggers: ImpactTrigger[];
  /** Tests called for without a matrix row (a tightened limit is proven by the test that measures it). */
  tests: RequiredTest[];
}

export type ChangeSubject =
  | {
      kind: "equipment";
      system: string;
      /** Other recipes the washer runs, which the same equipment change touches. */
      alsoRuns: string[];
      changes: EquipmentChange[];
      assessment: SubjectAssessment;
    }
  | {
      kind: "specification";
      spec: string;
      fromRevision: string;
      toRevision: string;
      changes: LimitChange[];
      assessment: SubjectAssessment;
    };

/**
 * An equipment change: its class from the equipment rules; each major change calls up the matrix
 * rows of its kind of stage ("stage or mode added or removed"), as a recipe's stage change does.
 */
export function assessEquipment(
  before: EquipmentStage[],
  after: EquipmentStage[],
): { impact: Impact; changes: EquipmentChange[]; assessment: SubjectAssessment } {
  const { impact, changes } = equipmentImpact(before, after);
  const triggers: ImpactTrigger[] = changes
    .filter((c) => c.impact === "major")
    .map((c) => ({
      subject: `stage:${c.kind as (typeof STAGE_KINDS)[number]}`,
      reason: `Equipment, ${c.stage}: ${c.reason}`,
    }));
  return { impact, changes, assessment: { impact, triggers, tests: [] } };
}

/** Which test proves each limit of a specification; wording and approval flags are judged by a person. */
export const LIMIT_TESTS: Record<keyof SpecLimits, TestType | null> = {
  ccc: "particle_cleanliness",
  maxMetallicUm: "particle_cleanliness",
  maxNonMetallicUm: "particle_cleanliness",
  maxFibreUm: "particle_cleanliness",
  gravimetricLimitMg: "gravimetric",
  gravimetricBasis: "gravimetric",
  minWettingTensionMNm: "wetting_tension",
  visualCriteria: "visual",
  drynessCriteria: "dryness",
  extraRequirements: null,
  customerApprovesChanges: null,
};

/** A change a part that passed before may now fail: tightened, or regrouped both ways. */
const tightening = (c: LimitChange) => c.direction === "tightened" || c.direction === "both";

/**
 * A revised specification against the recipes qualified to it. Tightening (any limit a part that
 * passed may now fail) is major: the process must be shown to meet the new limit, so each
 * tightened limit calls for the test that measures it, at the sample size the matrix gives that
 * test for a new part family (the nearest case: the same parts, a new requirement), or the largest
 * it gives that test anywhere. Loosening or rewording is minor: approval, no tests.
 */
export function assessSpecification(
  comparison: SpecComparison,
  matrix: MatrixRow[],
): SubjectAssessment {
  const tight = comparison.changes.filter(tightening);
  if (!tight.length)
    return { impact: comparison.changes.length ? "minor" : "editorial", triggers: [], tests: [] };
  const byTest = new Map<TestType, RequiredTest>();
  for (const change of tight) {
    const testType = LIMIT_TESTS[change.field];
    if (!testType) continue;
    const rows = matrix.filter((r) => r.testType === testType);
    const familyRows = rows.filter((r) => r.subject === "part_family");
    const candidates = familyRows.length ? familyRows : rows;
    if (!candidates.length) continue;
    const row = candidates.reduce((a, b) => (samplesFor(b) > samplesFor(a) ? b : a));
    const current = byTest.get(testType);
    if (current) {
      current.because.push(change.reason);
      continue;
    }
    byTest.set(testType, {
      testType,
      samples: samplesFor(row),
      minCycles: row.minCycles ?? DEFAULT_MIN_CYCLES,
      confidencePct: row.confidencePct,
      reliabilityPct: row.reliabilityPct,
      because: [change.reason],
    });
  }
  return {
    impact: "major",
    triggers: [],
    tests: [...byTest.values()].sort((a, b) => (a.testType < b.testType ? -1 : 1)),
  };
}

/** Tests from the matrix and tests called for directly, one per type, the larger sample holding. */
export function mergeTests(a: RequiredTest[], b: RequiredTest[]): RequiredTest[] {
  const byTest = new Map<TestType, RequiredTest>();
  for (const t of [...a, ...b]) {
    const current = byTest.get(t.testType);
    if (!current) {
      byTest.set(t.testType, { ...t, because: [...t.because] });
      continue;
    }
    for (const why of t.because) if (!current.because.includes(why)) current.because.push(why);
    if (t.samples > current.samples)
      Object.assign(current, {
        samples: t.samples,
        confidencePct: t.confidencePct,
        reliabilityPct: t.reliabilityPct,
      });
  }
  return [...byTest.values()].sort((x, y) => (x.testType < y.testType ? -1 : 1));
}
