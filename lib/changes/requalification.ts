import type { STAGE_KINDS } from "@/db/enums";
import { successRunSampleSize } from "@/lib/stats";
import type { RecipeDiff } from "./diff";
import type { MatrixSubject, TestType } from "@/lib/recipes/test-types";

export interface MatrixRow {
  subject: MatrixSubject;
  testType: TestType;
  /** Confidence and reliability as percentages, e.g. 95 and 90. */
  confidencePct: number;
  reliabilityPct: number;
  /** Distinct wash cycles the samples must come from (default 3). */
  minCycles?: number;
}

/** Samples from one cycle share its wash: three cycles is the usual minimum for independent samples [practice]. */
export const DEFAULT_MIN_CYCLES = 3;

export interface RequiredTest {
  testType: TestType;
  samples: number;
  confidencePct: number;
  reliabilityPct: number;
  /** Distinct wash cycles the samples must come from: the most any calling row asks. */
  minCycles: number;
  /** The changes that call for this test, in words. */
  because: string[];
}

/** Sample size for zero failures (success-run theorem, n = ln(1 − C) / ln(R), rounded up). */
/** One matrix row as a line of text, as the audit trail lists added and removed rows. */
export function matrixRowLine(
  r: Pick<MatrixRow, "subject" | "testType" | "confidencePct" | "reliabilityPct" | "minCycles">,
): string {
  const cycles = r.minCycles ?? DEFAULT_MIN_CYCLES;
  // The default is left unwritten, so rows saved before cycles were counted read as they did.
  return `${r.subject} → ${r.testType} @ ${r.confidencePct}/${r.reliabilityPct}${cycles === DEFAULT_MIN_CYCLES ? "" : ` from ${cycles} cycles`}`;
}

export function samplesFor(row: Pick<MatrixRow, "confidencePct" | "reliabilityPct">): number {
  return successRunSampleSize(row.confidencePct / 100, row.reliabilityPct / 100);
}

export interface ImpactTrigger {
  subject: MatrixSubject;
  reason: string;
}

/** A changed parameter calls up the rows for its kind anywhere and for its kind in its kind of stage. */
export function parameterTriggers(
  p: Pick<RecipeDiff["parameters"][number], "kind" | "stageKind">,
  reason: string,
): ImpactTrigger[] {
  const triggers: ImpactTrigger[] = [{ subject: `parameter:${p.kind}`, reason }];
  if (p.stageKind)
    triggers.push({ subject: `parameter:${p.stageKind}:${p.kind}` as MatrixSubject, reason });
  return triggers;
}

/** The major changes of a diff, each as the matrix subject it calls up. */
export function triggersOf(diff: RecipeDiff, extra: ImpactTrigger[] = []): ImpactTrigger[] {
  const triggers: ImpactTrigger[] = [];
  for (const p of diff.parameters) {
    if (p.impact === "major")
      triggers.push(...parameterTriggers(p, `${p.stage} · ${p.name}: ${p.reasons.join(" ")}`));
  }
  for (const s of diff.stages) {
    if (s.impact === "major")
      triggers.push({
        subject: `stage:${s.kind as (typeof STAGE_KINDS)[number]}`,
        reason: s.reason,
      });
  }
  for (const t of diff.texts) {
    if (t.field === "detergent" && t.impact === "major")
      triggers.push({ subject: "detergent", reason: `Detergent: "${t.old}" → "${t.new}".` });
  }
  return [...triggers, ...extra];
}

/**
 * The tests a major change calls for: every matrix row whose subject a trigger
 * names. Where several rows ask for the same test, the largest sample size holds.
 */
export function requiredTests(triggers: ImpactTrigger[], matrix: MatrixRow[]): RequiredTest[] {
  const byTest = new Map<TestType, RequiredTest>();
  for (const trigger of triggers) {
    for (const row of matrix.filter((r) => r.subject === trigger.subject)) {
      const samples = samplesFor(row);
      const minCycles = row.minCycles ?? DEFAULT_MIN_CYCLES;
      const current = byTest.get(row.testType);
      if (!current) {
        byTest.set(row.testType, {
          testType: row.testType,
          samples,
          confidencePct: row.confidencePct,
          reliabilityPct: row.reliabilityPct,
          minCycles,
          because: [trigger.reason],
        });
        continue;
      }
      if (!current.because.includes(trigger.reason)) current.because.push(trigger.reason);
      current.minCycles = Math.max(current.minCycles, minCycles);
      if (samples > current.samples)
        Object.assign(current, {
          samples,
          confidencePct: row.confidencePct,
          reliabilityPct: row.reliabilityPct,
        });
    }
  }
  return [...byTest.values()].sort((a, b) => (a.testType < b.testType ? -1 : 1));
}

const WASH: MatrixSubject[] = [
  "parameter:temperature",
  "parameter:time",
  "parameter:concentration",
  "parameter:ultrasonic_power",
  "parameter:ultrasonic_frequency",
  "parameter:spray_pressure",
  "parameter:flow",
  "stage:wash",
  "detergent",
];

/**
 * The first matrix, as product.md "Change impact" describes it: thermal, chemical
 * and mechanical wash parameters → particle cleanliness and gravimetric; final-rinse
 * water quality → visual stain and residue; drying → dryness and visual; loading →
 * cleanliness at the worst-case basket position. 95 % confidence, 90 % reliability
 * is a common choice [practice]; the admin sets the matrix the site uses.
 */
export const DEFAULT_MATRIX: MatrixRow[] = [
  ...WASH.flatMap((subject) =>
    (["particle_cleanliness", "gravimetric"] as const).map((testType) => ({
      subject,
      testType,
      confidencePct: 95,
      reliabilityPct: 90,
    })),
  ),
  ...(["parameter:conductivity_limit", "stage:final_rinse", "stage:rinse"] as const).flatMap(
    (subject) =>
      (["visual", "gravimetric"] as const).map((testType) => ({
        subject,
        testType,
        confidencePct: 95,
        reliabilityPct: 90,
      })),
  ),
  ...(
    ["parameter:drying_temperature", "parameter:vacuum_pressure", "stage:drying"] as const
  ).flatMap((subject) =>
    (["dryness", "visual"] as const).map((testType) => ({
      subject,
      testType,
      confidencePct: 95,
      reliabilityPct: 90,
    })),
  ),
  // Drying is judged by dryness and stains whichever of its parameters moves, time included.
  ...(["parameter:drying:time", "parameter:drying:other"] as const).flatMap((subject) =>
    (["dryness", "visual"] as const).map((testType) => ({
      subject,
      testType,
      confidencePct: 95,
      reliabilityPct: 90,
    })),
  ),
  // Loading: cleanliness at the worst-case basket position.
  ...(["parameter:basket_loading", "parameter:load_pattern", "parameter:fixture"] as const).map(
    (subject) => ({
      subject,
      testType: "particle_cleanliness" as const,
      confidencePct: 95,
      reliabilityPct: 90,
    }),
  ),
  {
    subject: "parameter:filter_interval",
    testType: "particle_cleanliness",
    confidencePct: 95,
    reliabilityPct: 90,
  },
  {
    subject: "parameter:other",
    testType: "particle_cleanliness",
    confidencePct: 95,
    reliabilityPct: 90,
  },
  {
    subject: "stage:other",
    testType: "particle_cleanliness",
    confidencePct: 95,
    reliabilityPct: 90,
  },
  ...(["particle_cleanliness", "gravimetric", "visual", "dryness"] as const).map((testType) => ({
    subject: "part_family" as const,
    testType,
    confidencePct: 95,
    reliabilityPct: 90,
  })),
];
