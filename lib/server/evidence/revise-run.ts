import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  changeRequestEvidence,
  evidenceFiles,
  testRunLabDetails,
  testRunMethods,
  testSamples,
  testRuns,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { refreshOutcome } from "./refresh-outcome";
import { getRunRow } from "./run-content";
import { copyCitedInstruments } from "@/lib/server/instruments/cited";

/**
 * A correction of a performed or verified run: a new open revision carrying the
 * same data and files (files are shared by hash, never copied), the links to the
 * change requests it was offered to, the reason, and a link back; the old revision
 * is kept, marked superseded, with its signatures.
 */
export async function reviseRun(
  actor: { id: string; name: string },
  input: { runId: string; reason: string },
) {
  return getDb().transaction(async (tx) => {
    const old = await getRunRow(tx, input.runId);
    if (!old) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
    if (old.status !== "performed" && old.status !== "verified") {
      throw new UserFacingError(
        old.status === "open"
          ? "An open run can be edited directly; no revision is needed."
          : "This revision is already superseded.",
      );
    }
    const { id: _id, createdAt: _c, ...fields } = old;
    const [next] = await tx
      .insert(testRuns)
      .values({
        ...fields,
        revision: old.revision + 1,
        status: "open",
        supersedesId: old.id,
        revisionReason: input.reason,
        createdBy: actor.id,
      })
      .returning();
    const samples = await tx.select().from(testSamples).where(eq(testSamples.runId, old.id));
    if (samples.length)
      await tx
        .insert(testSamples)
        .values(
          samples.map(({ id: _r, createdAt, ...r }) => ({ ...r, createdAt, runId: next.id })),
        );
    const files = await tx.select().from(evidenceFiles).where(eq(evidenceFiles.runId, old.id));
    // New rows for the same stored bytes; the lab details' photo references follow them.
    const fileIds = new Map(files.map((f) => [f.id, crypto.randomUUID()]));
    if (files.length)
      await tx
        .insert(evidenceFiles)
        .values(files.map((f) => ({ ...f, id: fileIds.get(f.id)!, runId: next.id })));
    const [lab] = await tx
      .select()
      .from(testRunLabDetails)
      .where(eq(testRunLabDetails.runId, old.id));
    if (lab)
      await tx
        .insert(testRunLabDetails)
        .values({ ...lab, runId: next.id, details: carryPhotos(lab.details, fileIds) });
    await copyCitedInstruments(tx, old.id, next.id);
    // The method versions the corrected run used stay cited, approved or since superseded.
    const cited = await tx.select().from(testRunMethods).where(eq(testRunMethods.runId, old.id));
    if (cited.length)
      await tx.insert(testRunMethods).values(cited.map((c) => ({ ...c, runId: next.id })));
    const links = await tx
      .select()
      .from(changeRequestEvidence)
      .where(eq(changeRequestEvidence.testRunId, old.id));
    if (links.length)
      await tx.insert(changeRequestEvidence).values(
        links.map((l) => ({
          requirementId: l.requirementId,
          testRunId: next.id,
          linkedBy: actor.id,
        })),
      );
    await tx.update(testRuns).set({ status: "superseded" }).where(eq(testRuns.id, old.id));
    await refreshOutcome(tx, next);
    await appendAudit(tx, actor as AuditActor, {
      eventType: "test_run.superseded",
      recordType: "test_run",
      recordId: old.id,
      old: { status: old.status },
      new: { status: "superseded", by: next.id },
      reason: input.reason,
    });
    await appendAudit(tx, actor as AuditActor, {
      eventType: "test_run.revised",
      recordType: "test_run",
      recordId: next.id,
      new: {
        number: next.number,
        revision: next.revision,
        supersedes: old.id,
        evidenceLinks: links.length,
      },
      reason: input.reason,
    });
    return next;
  });
}

/** The lab details of a new revision name the new revision's rows of the same photo files. */
function carryPhotos(details: Record<string, unknown>, fileIds: Map<string, string>) {
  const largest = details.largest as Record<string, { photoFileId: string | null }> | undefined;
  if (!largest) return details;
  return {
    ...details,
    largest: Object.fromEntries(
      Object.entries(largest).map(([type, p]) => [
        type,
        { ...p, photoFileId: p.photoFileId ? (fileIds.get(p.photoFileId) ?? null) : null },
      ]),
    ),
  };
}
