/** The bath values a measurement plan controls, with their units and physical bounds. */
export const BATH_CHEMISTRY = {
  concentrationPct: { label: "Detergent concentration", unit: "%", min: 0, max: 100 },
  ph: { label: "pH", unit: "pH", min: 0, max: 14 },
  temperatureC: { label: "Bath temperature", unit: "°C", min: 0, max: 100 },
  conductivityUsPerCm: { label: "Bath conductivity", unit: "µS/cm", min: 0, max: 200_000 },
  oilContentGPerL: { label: "Oil content", unit: "g/L", min: 0, max: 1000 },
} as const;
export type BathChemistryVariable = keyof typeof BATH_CHEMISTRY;
export const BATH_CHEMISTRY_VARIABLES = Object.keys(BATH_CHEMISTRY) as BathChemistryVariable[];

/**
 * One line of a tank's measurement plan. Either side may be open (an oil content has only an
 * upper limit); the action band lies inside the reject band, and the target inside both.
 */
export interface BathLimits {
  target: number | null;
  actionLow: number | null;
  actionHigh: number | null;
  rejectLow: number | null;
  rejectHigh: number | null;
}

export type LimitState = "ok" | "action" | "reject";

export const LIMIT_STATE_LABELS: Record<LimitState, string> = {
  ok: "Within action limits",
  action: "Beyond action limit",
  reject: "Beyond reject limit",
};

/**
 * Every ordering fault of a plan line, each under the field a form shows it beside:
 * reject low ≤ action low ≤ target ≤ action high ≤ reject high, wherever both ends are given.
 */
export function limitOrderProblems(l: BathLimits): { field: keyof BathLimits; message: string }[] {
  const order: (keyof BathLimits)[] = [
    "rejectLow",
    "actionLow",
    "target",
    "actionHigh",
    "rejectHigh",
  ];
  const words: Record<keyof BathLimits, string> = {
    rejectLow: "the lower reject limit",
    actionLow: "the lower action limit",
    target: "the target",
    actionHigh: "the upper action limit",
    rejectHigh: "the upper reject limit",
  };
  const problems: { field: keyof BathLimits; message: string }[] = [];
  for (let i = 1; i < order.length; i++) {
    const here = order[i];
    const value = l[here];
    if (value === null) continue;
    // Compare with the nearest value given below this one, so a gap in the plan does not hide a fault.
    for (let j = i - 1; j >= 0; j--) {
      const below = l[order[j]];
      if (below === null) continue;
      const strict =
        (order[j] === "rejectLow" && here === "actionLow") ||
        (order[j] === "actionHigh" && here === "rejectHigh");
      if (strict ? value <= below : value < below)
        problems.push({
          field: here,
          message: `${capitalise(words[here])} must be ${strict ? "above" : "at or above"} ${words[order[j]]}.`,
        });
      break;
    }
  }
  if (
    l.actionLow === null &&
    l.actionHigh === null &&
    l.rejectLow === null &&
    l.rejectHigh === null
  )
    problems.push({ field: "actionLow", message: "Give at least one action or reject limit." });
  return problems;
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * Where a reading stands against its plan line: beyond a reject limit, beyond an action limit, or
 * ok. A value on a limit is within it (the limit is the last acceptable value, common practice).
 */
export function evaluateReading(
  value: number,
  l: BathLimits,
): { state: LimitState; side: "low" | "high" | null; limit: number | null } {
  if (l.rejectLow !== null && value < l.rejectLow)
    return { state: "reject", side: "low", limit: l.rejectLow };
  if (l.rejectHigh !== null && value > l.rejectHigh)
    return { state: "reject", side: "high", limit: l.rejectHigh };
  if (l.actionLow !== null && value < l.actionLow)
    return { state: "action", side: "low", limit: l.actionLow };
  if (l.actionHigh !== null && value > l.actionHigh)
    return { state: "action", side: "high", limit: l.actionHigh };
  return { state: "ok", side: null, limit: null };
}

const RANK: Record<LimitState, number> = { ok: 0, action: 1, reject: 2 };

/** The worst state of a reading's values, with one sentence per value beyond a limit. */
export function evaluateReadingValues(
  values: Partial<Record<BathChemistryVariable, number | null>>,
  plan: Partial<Record<BathChemistryVariable, BathLimits>>,
): { state: LimitState; findings: string[] } {
  let state: LimitState = "ok";
  const findings: string[] = [];
  for (const variable of BATH_CHEMISTRY_VARIABLES) {
    const value = values[variable];
    const limits = plan[variable];
    if (value === null || value === undefined || !limits) continue;
    const result = evaluateReading(value, limits);
    if (result.state === "ok") continue;
    const { label, unit } = BATH_CHEMISTRY[variable];
    // pH is a number without a unit: "pH 13.2", not "pH 13.2 pH".
    const withUnit = (n: number | null) => (unit === "pH" ? `${n}` : `${n} ${unit}`);
    findings.push(
      `${label} ${withUnit(value)} is ${result.side === "low" ? "below" : "above"} the ${result.state} limit ${withUnit(result.limit)}`,
    );
    if (RANK[result.state] > RANK[state]) state = result.state;
  }
  return { state, findings };
}

const DAY_MS = 86_400_000;

/** Whole days since the bath was last charged (or since the first entry, if never recharged). */
export function bathAgeDays(chargedAt: string | null, now: Date): number | null {
  if (!chargedAt) return null;
  const from = new Date(chargedAt).getTime();
  if (Number.isNaN(from)) return null;
  return Math.max(0, Math.floor((now.getTime() - from) / DAY_MS));
}
