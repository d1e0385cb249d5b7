import "server-only";
import { and, eq, inArray, isNull } from "drizzle-orm";
import { getDb, type Executor, type Tx } from "@/db/client";
import {
  changeCustomerDecisions,
  cleanlinessSpecs,
  evidenceFiles,
  partFamilies,
  requalificationIntervals,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { evaluateCustomerApproval, type CustomerSpec } from "@/lib/changes/customer-approval";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { todayUtc } from "@/lib/format/date";
import { UserFacingError } from "@/lib/server/errors";
import { loadChangeState, type ChangeState } from "./state";

/** The specifications of the part families the change touches: those qualified on the version it replaces, and the one it adds. */
type ApprovalSubject = Pick<ChangeState, "cr" | "fromVersion" | "assessmentRow" | "impact">;

async function touchedSpecs(db: Executor, state: ApprovalSubject): Promise<CustomerSpec[]> {
  const familyIds = new Set<string>();
  if (state.fromVersion) {
    const rows = await db
      .select({ partFamilyId: requalificationIntervals.partFamilyId })
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.recipeVersionId, state.fromVersion.id));
    for (const r of rows) familyIds.add(r.partFamilyId);
  }
  if (state.assessmentRow.partFamilyId) familyIds.add(state.assessmentRow.partFamilyId);
  if (familyIds.size === 0) return [];
  const specs = await db
    .selectDistinct({ spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(inArray(partFamilies.id, [...familyIds]));
  return specs.map(({ spec }) => ({
    id: spec.id,
    label: `${spec.code} rev ${spec.revision}${spec.customer ? ` (${spec.customer})` : ""}`,
    customerApprovesChanges: spec.customerApprovesChanges,
  }));
}

/** Where the customer-approval gate stands for one change. */
export async function loadCustomerApproval(db: Executor, state: ApprovalSubject) {
  const specs = await touchedSpecs(db, state);
  const decisions = await db
    .select()
    .from(changeCustomerDecisions)
    .where(eq(changeCustomerDecisions.changeRequestId, state.cr.id));
  return evaluateCustomerApproval(state.impact, specs, decisions);
}

/** Refuses to make the new version effective while a customer's approval is missing or refused. */
export async function assertCustomerApproval(tx: Tx, state: ChangeState) {
  const gate = await loadCustomerApproval(tx, state);
  if (!gate.holds)
    throw new UserFacingError(
      `Not made effective: the customer must approve this major change first. ${gate.missing.join("; ")}.`,
    );
}

/** Records the customer's decision, with the date, their reference and their letter as uploaded. */
export async function recordCustomerDecision(
  actor: AuditActor & { id: string },
  input: {
    changeRequestId: string;
    specId: string;
    decision: "approved" | "rejected";
    decidedOn: string;
    reference: string;
    letterFileId: string;
  },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    if (!OPEN_STATUSES.includes(state.cr.status))
      throw new UserFacingError("This change request is no longer open.");
    const gate = await loadCustomerApproval(tx, state);
    const row = gate.specs.find((s) => s.spec.id === input.specId);
    if (!row)
      throw new UserFacingError("This change needs no customer decision for that specification.", {
        kind: "invalid",
        field: "specId",
      });
    if (input.decidedOn > todayUtc(now))
      throw new UserFacingError("The customer's decision cannot be dated in the future.", {
        kind: "invalid",
        field: "decidedOn",
      });
    const [letter] = await tx
      .select({
        id: evidenceFiles.id,
        name: evidenceFiles.originalName,
        sha256: evidenceFiles.sha256,
      })
      .from(evidenceFiles)
      .where(and(eq(evidenceFiles.id, input.letterFileId), isNull(evidenceFiles.runId)));
    if (!letter)
      throw new UserFacingError("The customer's letter was not found: upload it again.", {
        kind: "invalid",
        field: "letterFileId",
      });
    const [saved] = await tx
      .insert(changeCustomerDecisions)
      .values({
        changeRequestId: state.cr.id,
        specId: input.specId,
        decision: input.decision,
        decidedOn: input.decidedOn,
        reference: input.reference,
        letterFileId: letter.id,
        recordedBy: actor.id,
        recordedAt: now.toISOString(),
      })
      .returning();
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.customer_decision_recorded",
        recordType: "change_request",
        recordId: state.cr.id,
        old: row.decision ? { decision: row.decision.decision } : null,
        new: {
          specification: row.spec.label,
          decision: input.decision,
          decidedOn: input.decidedOn,
          reference: input.reference,
          letterSha256: letter.sha256,
          entry: saved.id,
        },
      },
      now,
    );
  });
}
