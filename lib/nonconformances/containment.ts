/**
 * Containment of a failed result: everything processed on the same recipe and part family
 * since the last passing verified test is suspect, because that test is the last evidence that
 * the process cleaned to specification (common practice in cleanliness control: the "last good
 * check" bounds the suspect population, as in IATF 16949 8.7.1 nonconforming product control).
 */

/** One thing processed on the recipe and part family: a test run now, a wash cycle with its lots later. */
export interface ProcessedItem {
  kind: "run" | "cycle";
  id: string;
  label: string;
  lots: string[];
  /** When it was processed (ISO date or date-time, UTC). */
  at: string;
}

/** A verified test with its outcome, as the bound of the suspect population. */
export interface VerifiedTest {
  id: string;
  at: string;
  outcome: "pass" | "fail" | "incomplete";
}

/** A comparable instant for a date or date-time: a bare date counts as its start (UTC). */
function instant(at: string): number {
  return Date.parse(/^\d{4}-\d{2}-\d{2}$/.test(at) ? `${at}T00:00:00Z` : at);
}

/** The most recent passing verified test at or before `failedAt`, or null when there is none. */
export function lastPassingTest(
  tests: readonly VerifiedTest[],
  failedAt: string,
): VerifiedTest | null {
  const bound = instant(failedAt);
  let best: VerifiedTest | null = null;
  for (const t of tests) {
    if (t.outcome !== "pass" || instant(t.at) > bound) continue;
    if (!best || instant(t.at) > instant(best.at)) best = t;
  }
  return best;
}

/**
 * The affected items: those processed after the last passing verified test (all of them when
 * there is none) up to `until` (when the nonconformance was raised), oldest first. The passing
 * test itself is not suspect; the failed one is.
 */
export function containmentScope(
  items: readonly ProcessedItem[],
  lastPass: Pick<VerifiedTest, "id" | "at"> | null,
  until: string,
): ProcessedItem[] {
  const from = lastPass ? instant(lastPass.at) : -Infinity;
  const to = instant(until);
  return (
    items
      // Same-day items stay suspect: a date without a time cannot say which came first.
      .filter((i) => i.id !== lastPass?.id && instant(i.at) >= from && instant(i.at) <= to)
      .toSorted((a, b) => instant(a.at) - instant(b.at) || a.label.localeCompare(b.label))
  );
}
