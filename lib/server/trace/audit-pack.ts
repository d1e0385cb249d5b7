import "server-only";
import { asc, eq, inArray } from "drizzle-orm";
import { loadEmergencies } from "@/lib/server/changes/emergencies";
import type { Executor } from "@/db/client";
import { auditEvents, nonconformanceActions, nonconformances } from "@/db/schema";
import { readAuditEvent, verifyAuditChain } from "@/lib/audit";
import { narrativeText } from "@/lib/changes/content";
import { compareChainWithCheckpoints } from "@/lib/server/audit/check-integrity";
import { signatureValidity } from "@/lib/signatures/rules";
import { loadChangeState } from "@/lib/server/changes/state";
import { changeEvidence, changeSignatures } from "./evidence-of-change";

/**
 * Everything an auditor needs about one change request, read once: the record,
 * its justification, the parameter diff and impact with its working, every
 * signature with what it binds to, the evidence with its file hashes, and the
 * audit events of all of these, with the chain's integrity at the time of export
 * and the newest signed checkpoint, which anchors it outside the database.
 */
export async function loadAuditPack(db: Executor, changeRequestId: string) {
  const state = await loadChangeState(db, changeRequestId);
  const [signatures, evidence] = await Promise.all([
    changeSignatures(db, changeRequestId),
    changeEvidence(db, changeRequestId),
  ]);
  // The nonconformances whose corrective actions this change carries out, with their own events.
  const ncs = await db
    .selectDistinct({
      id: nonconformances.id,
      number: nonconformances.number,
      title: nonconformances.title,
      status: nonconformances.status,
    })
    .from(nonconformanceActions)
    .innerJoin(nonconformances, eq(nonconformances.id, nonconformanceActions.nonconformanceId))
    .where(eq(nonconformanceActions.changeRequestId, changeRequestId));
  const runSignatureIds = evidence.flatMap((r) => r.signatures.map((s) => s.id));
  const recordIds = [
    changeRequestId,
    ...(state.fromVersion ? [state.fromVersion.id] : []),
    state.toVersion.id,
    ...(state.narrative ? [state.narrative.id] : []),
    ...signatures.map((s) => s.id),
    ...evidence.map((r) => r.id),
    ...runSignatureIds,
    ...evidence.flatMap((r) => r.files.map((f) => f.id)),
    ...ncs.map((n) => n.id),
  ];
  const [events, chain, checkpoints] = await Promise.all([
    db
      .select()
      .from(auditEvents)
      // Signature events are filed under the signature row, exports of this pack under the change request.
      .where(inArray(auditEvents.recordId, recordIds))
      .orderBy(asc(auditEvents.seq)),
    verifyAuditChain(db),
    // The newest checkpoint alone detects a re-chained rewrite before it; the full check on the integrity page reads them all.
    compareChainWithCheckpoints(db, { newestOnly: true }),
  ]);
  const emergency = (await loadEmergencies(db, [changeRequestId])).get(changeRequestId) ?? null;
  return {
    cr: state.cr,
    emergency,
    kind: state.assessmentRow.kind,
    revision: state.assessmentRow.revision,
    raiseReason: state.assessmentRow.raiseReason,
    recipe: state.recipe,
    fromVersion: state.fromVersion,
    toVersion: state.toVersion,
    family: state.family,
    contentHash: state.contentHash,
    narrative: narrativeText(state.narrative?.content ?? null),
    assessment: state.assessment,
    impact: state.impact,
    requirements: state.requirements,
    signatures: signatures.map((s) => ({
      ...s,
      binding:
        s.revision !== state.assessmentRow.revision
          ? ("earlier_revision" as const)
          : signatureValidity(s.contentHash, state.contentHash),
    })),
    evidence,
    nonconformances: ncs,
    // Each row as stored (the pack lists its hash), named by today's event type.
    events: events.map((row) => ({ ...row, eventType: readAuditEvent(row).eventType })),
    chain,
    checkpoints,
  };
}
export type AuditPack = Awaited<ReturnType<typeof loadAuditPack>>;
