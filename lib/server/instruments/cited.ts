import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Executor, Tx } from "@/db/client";
import { instruments, testRunInstruments } from "@/db/schema";

/** The instruments a run cites, by asset number. */
export async function citedInstruments(db: Executor, runId: string) {
  return db
    .select({ instrument: instruments })
    .from(testRunInstruments)
    .innerJoin(instruments, eq(instruments.id, testRunInstruments.instrumentId))
    .where(eq(testRunInstruments.runId, runId))
    .orderBy(asc(instruments.assetNumber))
    .then((rows) => rows.map((r) => r.instrument));
}

/** The asset numbers a run's content hash covers. */
export async function citedAssetNumbers(db: Executor, runId: string) {
  return (await citedInstruments(db, runId)).map((i) => i.assetNumber);
}

/** A new revision cites what the revision it replaces cited. */
export async function copyCitedInstruments(tx: Tx, fromRunId: string, toRunId: string) {
  const rows = await tx
    .select({ instrumentId: testRunInstruments.instrumentId })
    .from(testRunInstruments)
    .where(eq(testRunInstruments.runId, fromRunId));
  if (rows.length > 0)
    await tx
      .insert(testRunInstruments)
      .values(rows.map((r) => ({ runId: toRunId, instrumentId: r.instrumentId })));
}
