import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles, testSamples } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { isCsvTestType, type CsvSample } from "@/lib/evidence/csv-import";
import { UserFacingError } from "@/lib/server/errors";
import { getStore } from "@/lib/storage";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";
import { sha256OfBytes } from "./store-file";

const INSERT_BATCH = 500;
const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/**
 * Saves the rows of a CSV file that has already been validated whole, and the
 * file itself as evidence, in one transaction: all rows or none.
 */
export async function importCsvRows(
  actor: { id: string; name: string },
  input: {
    runId: string;
    testType: string;
    rows: CsvSample[];
    fileName: string;
    bytes: Uint8Array;
  },
) {
  if (input.rows.length === 0)
    throw new UserFacingError("The file has no rows to import.", { kind: "invalid" });
  const sha256 = sha256OfBytes(input.bytes);
  await getStore().put(sha256, input.bytes);
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    if (!isCsvTestType(run.testType))
      throw new UserFacingError("CSV import is for particle cleanliness and gravimetric runs.", {
        kind: "invalid",
      });
    // The rows were validated for one test type; the run must be of that type.
    if (run.testType !== input.testType)
      throw new UserFacingError(
        "The file was read for another test type than this run's. Nothing was imported.",
        { kind: "invalid" },
      );
    const labels = input.rows.map((r) => r.sampleLabel);
    const recorded = new Set(
      (
        await tx
          .select({ label: testSamples.sampleLabel })
          .from(testSamples)
          .where(eq(testSamples.runId, run.id))
      ).map((e) => e.label),
    );
    const clash = labels.filter((l) => recorded.has(l));
    if (clash.length > 0)
      throw new UserFacingError(
        `Already recorded in this run: ${clash.slice(0, 10).join(", ")}. Nothing was imported.`,
      );
    // The file driver runs each insert synchronously: between batches, other requests (reads beside
    // the transaction) get their turn, so a 100,000-row import does not stall the server. Each
    // batch's rows are built as it is written: a second copy of all the file's rows, held whole,
    // was a large part of the server's memory peak during an import.
    for (let i = 0; i < input.rows.length; i += INSERT_BATCH) {
      await tx.insert(testSamples).values(
        input.rows
          .slice(i, i + INSERT_BATCH)
          .map(({ sampleLabel, cycleNumber, basketPosition, worstCase, ...data }) => ({
            runId: run.id,
            sampleLabel,
            cycleNumber: cycleNumber ?? null,
            basketPosition: basketPosition ?? null,
            worstCase,
            data,
          })),
      );
      await yieldToEventLoop();
    }
    const [file] = await tx
      .insert(evidenceFiles)
      .values({
        runId: run.id,
        sha256,
        originalName: input.fileName,
        mimeType: "text/csv",
        sizeBytes: input.bytes.byteLength,
        kind: "csv",
        uploadedBy: actor.id,
      })
      .returning();
    const outcome = await refreshOutcome(tx, run);
    await appendAudit(tx, actor, {
      eventType: "test_run.csv_imported",
      recordType: "test_run",
      recordId: run.id,
      new: {
        fileId: file.id,
        sha256,
        name: input.fileName,
        rows: input.rows.length,
        samples: labels.slice(0, 50),
        outcome: outcome.outcome,
      },
    });
    return { imported: input.rows.length };
  });
}
