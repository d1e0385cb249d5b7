// Not "server-only": a plain read, also used by the demo seed under tsx.
import { asc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { labMethods, testRunMethods } from "@/db/schema";

/** The lab method versions a run revision cites, with what its hash and report show of them. */
export async function getRunMethods(db: Executor, runId: string) {
  return db
    .select({
      kind: testRunMethods.kind,
      methodId: testRunMethods.methodId,
      code: labMethods.code,
      version: labMethods.version,
      name: labMethods.name,
      status: labMethods.status,
      details: labMethods.details,
    })
    .from(testRunMethods)
    .innerJoin(labMethods, eq(labMethods.id, testRunMethods.methodId))
    .where(eq(testRunMethods.runId, runId))
    .orderBy(asc(testRunMethods.kind));
}
export type RunMethod = Awaited<ReturnType<typeof getRunMethods>>[number];
