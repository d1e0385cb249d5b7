import { TEST_TYPE_LABELS, type TestType } from "@/lib/recipes/test-types";

export interface GateRequirement {
  id: string;
  testType: TestType;
  samples: number;
  /** Distinct wash cycles the samples must come from; null where the requirement predates counting them. */
  cycles?: number | null;
}

export interface GateRun {
  number: string;
  testType: TestType;
  /** Computed from the raw data by the evidence feature, never typed. */
  outcome: "pass" | "fail" | "incomplete" | null;
  status: "open" | "performed" | "verified" | "superseded";
  sampleCount: number;
  /** Distinct wash cycles the run's samples name; a sample naming none counts for no cycle. */
  cycleCount?: number;
  /** Who signed "performed" and who signed "verified" on this run. */
  performedBy: string[];
  verifiedBy: string[];
}

export interface RequirementState {
  requirement: GateRequirement;
  satisfiedBy: string | null;
  problems: string[];
}

export interface GateResult {
  holds: boolean;
  requirements: RequirementState[];
  /** Exactly what is missing, one line each, as the page and the refusal show it. */
  missing: string[];
}

const plural = (n: number, one: string) => `${n} ${one}${n === 1 ? "" : "s"}`;

function runProblems(req: GateRequirement, run: GateRun): string[] {
  const problems: string[] = [];
  if (run.testType !== req.testType)
    problems.push(
      `${run.number} is a ${TEST_TYPE_LABELS[run.testType].toLowerCase()} test, not ${TEST_TYPE_LABELS[req.testType].toLowerCase()}`,
    );
  if (run.outcome !== "pass")
    problems.push(
      `${run.number} computed outcome is ${run.outcome ?? "not yet computed"}, not pass`,
    );
  if (run.sampleCount < req.samples)
    problems.push(`${run.number} has ${run.sampleCount} samples, ${req.samples} required`);
  // Parts from one basket are not independent: the success-run sample size assumes they are.
  const cycles = run.cycleCount ?? 0;
  if (req.cycles && cycles < req.cycles)
    problems.push(
      `${run.number} has ${plural(run.sampleCount, "part")} from ${plural(cycles, "cycle")}; needs ${plural(req.cycles, "cycle")}`,
    );
  const secondPerson = run.verifiedBy.some((v) => !run.performedBy.includes(v));
  if (run.status === "superseded")
    problems.push(`${run.number} was superseded by a later revision`);
  else if (run.status !== "verified" || !secondPerson)
    problems.push(`${run.number} is not verified by a second person`);
  return problems;
}

/**
 * The requalification gate (product.md "Lifecycles"): every required test has a
 * linked run whose computed outcome passes with at least the required samples
 * and that someone other than its performer verified. The computed pass supports,
 * and never replaces, the engineer's judgement; the gate only refuses.
 */
export function evaluateGate(
  requirements: GateRequirement[],
  linked: Map<string, GateRun[]>,
): GateResult {
  const states = requirements.map((requirement): RequirementState => {
    const runs = linked.get(requirement.id) ?? [];
    const label = `${TEST_TYPE_LABELS[requirement.testType]} (${requirement.samples} samples)`;
    if (runs.length === 0)
      return { requirement, satisfiedBy: null, problems: [`${label}: no test run linked`] };
    const checked = runs.map((run) => ({ run, problems: runProblems(requirement, run) }));
    const ok = checked.find((c) => c.problems.length === 0);
    if (ok) return { requirement, satisfiedBy: ok.run.number, problems: [] };
    return {
      requirement,
      satisfiedBy: null,
      problems: checked.flatMap((c) => c.problems.map((p) => `${label}: ${p}`)),
    };
  });
  const missing = states.flatMap((s) => s.problems);
  return { holds: missing.length === 0, requirements: states, missing };
}
