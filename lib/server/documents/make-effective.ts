// No "server-only" marker: the server's timer (instrumentation.ts) imports this too.
import { and, eq, lte, ne } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { documents, documentVersions, type DocumentVersion } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR, type AuditActor } from "@/lib/audit";
import { todayUtc } from "@/lib/format/date";

/**
 * Makes an approved version effective and supersedes the one it replaces, in
 * the caller's transaction. Signatures stay with the versions they were given on.
 */
export async function makeEffectiveInTx(
  tx: Tx,
  actor: AuditActor,
  version: DocumentVersion,
  now: Date,
) {
  const previous = await tx
    .select()
    .from(documentVersions)
    .where(
      and(
        eq(documentVersions.documentId, version.documentId),
        eq(documentVersions.status, "effective"),
        ne(documentVersions.id, version.id),
      ),
    );
  for (const old of previous) {
    await tx
      .update(documentVersions)
      .set({ status: "superseded" })
      .where(eq(documentVersions.id, old.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.superseded",
        recordType: "document_version",
        recordId: old.id,
        old: { status: "effective", version: old.version },
        new: { status: "superseded", byVersion: version.version },
      },
      now,
    );
  }
  await tx
    .update(documentVersions)
    .set({ status: "effective" })
    .where(eq(documentVersions.id, version.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "document.effective",
      recordType: "document_version",
      recordId: version.id,
      old: { status: "approved" },
      new: { status: "effective", effectiveDate: version.effectiveDate, version: version.version },
    },
    now,
  );
}

/** Approved versions whose effective date has come: run by the server's timer. */
export async function makeDueVersionsEffective(now = new Date()) {
  const today = todayUtc(now);
  // A change narrative becomes effective when its change request closes, never by date.
  const due = await getDb()
    .select({ version: documentVersions })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(
      and(
        eq(documentVersions.status, "approved"),
        lte(documentVersions.effectiveDate, today),
        ne(documents.type, "change_narrative"),
      ),
    );
  for (const { version } of due) {
    await getDb().transaction((tx) => makeEffectiveInTx(tx, SYSTEM_ACTOR, version, now));
  }
  return due.length;
}
