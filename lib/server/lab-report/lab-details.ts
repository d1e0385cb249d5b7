import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { testRunLabDetails } from "@/db/schema";
import { SIZE_CLASSES } from "@/lib/cleanliness";
import { countedBelowLimit } from "@/lib/lab-report/analysed-classes";
import type { LabDetails } from "@/lib/schemas/lab-details";
import { UserFacingError } from "@/lib/server/errors";

/** The run's lab details as stored (validated by `labDetailsSchema` when saved), or null. */
export async function getLabDetails(db: Executor, runId: string): Promise<LabDetails | null> {
  const [row] = await db
    .select({ details: testRunLabDetails.details })
    .from(testRunLabDetails)
    .where(eq(testRunLabDetails.runId, runId));
  return (row?.details as LabDetails | undefined) ?? null;
}

const range = (key: string) => {
  const c = SIZE_CLASSES.find((x) => x.key === key)!;
  return c.maxUm === null ? `≥ ${c.minUm} µm` : `${c.minUm}–${c.maxUm} µm`;
};

/**
 * Refuses counts in a class the analysis could not see whole: below the lower size limit a class
 * was not analysed, so a count there contradicts the method recorded for the run.
 */
export function assertCountsWithinLimit(
  counts: Partial<Record<string, number>>,
  lowerSizeLimitUm: number,
  opts: { what: string; field: (classKey: string) => string },
) {
  const below = countedBelowLimit(counts, lowerSizeLimitUm);
  if (below.length === 0) return;
  const k = below[0];
  throw new UserFacingError(
    `${opts.what} has particles in class ${k} (${range(k)}), which a lower size limit of ${lowerSizeLimitUm} µm does not analyse whole. Correct the counts or the lower size limit.`,
    { kind: "invalid", field: opts.field(k) },
  );
}
