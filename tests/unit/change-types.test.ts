import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeEffectivenessChecks,
  changeRequests,
  emailOutbox,
  emergencyChanges,
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipes,
  recipeVersions,
  signatures,
  testRuns,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import type { RichDoc } from "@/lib/documents/rich-text";
import { narrativeDocument } from "@/lib/changes/content";
import { addDays } from "@/lib/changes/emergency";
import { todayUtc } from "@/lib/format/date";
import { proposalSchema } from "@/lib/schemas/change";
import { emergencySchema, unaffectedSchema } from "@/lib/schemas/change-types";
import { saveDraft } from "@/lib/server/documents/save-draft";
import {
  addAffectedDocument,
  confirmDocumentUnaffected,
  listControlledDocuments,
} from "@/lib/server/changes/affected-documents";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { loadEffectiveness, recordEffectivenessOutcomes } from "@/lib/server/changes/effectiveness";
import { emergencyQueueProvider } from "@/lib/server/changes/emergency-queue-provider";
import { endChange } from "@/lib/server/changes/end-change";
import { escalateOverdueEmergencyApprovals } from "@/lib/server/changes/escalate-emergency-approvals";
import { implementEmergency } from "@/lib/server/changes/implement-emergency";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { changeQueueProvider } from "@/lib/server/changes/queue-provider";
import { reopenChange } from "@/lib/server/changes/reopen-change";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { setChangeControlSettings } from "@/lib/server/changes/settings";
import { loadChangeState } from "@/lib/server/changes/state";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};
const DAY = 86_400_000;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "reviewer", "technician", "admin"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
}, 120_000);
afterAll(() => t.cleanup());

const signing = async (id: string) => ({
  changeRequestId: id,
  password: DEMO_PASSWORD,
  contentHash: (await loadChangeState(t.db, id)).contentHash,
});

/** A minor change on the valve-body recipe (rinse time inside its range), assessed and signed. */
async function assessedMinorChange(title: string, rinseTime: string) {
  const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
  const cr = await openChangeRequest(people.engineer, {
    recipeId: recipe.id,
    title,
    kind: "parameter_change",
  });
  const state = await loadChangeState(t.db, cr.id);
  await saveProposal(
    people.engineer,
    proposalSchema.parse(
      await proposalForm(state, (p) => p.key === "rinse.time" && (p.setpoint = rinseTime)),
    ),
  );
  const s = await loadChangeState(t.db, cr.id);
  await saveDraft(
    { ...people.engineer, roles: ["engineer"] },
    {
      versionId: s.narrative!.id,
      lockVersion: s.narrative!.lockVersion,
      content: narrativeDocument("Chip load from the new line needs a longer rinse.") as RichDoc,
      overwrite: false,
    },
  );
  await assessChange(people.engineer, await signing(cr.id));
  return cr.id;
}

const versionStatus = async (id: string) =>
  (await t.db.select().from(recipeVersions).where(eq(recipeVersions.id, id)))[0];

describe("emergency change (issue #13 item 3)", () => {
  let crId: string;
  const now = new Date();
  const today = todayUtc(now);

  it("refuses a past or too distant approval deadline at its field and changes nothing", async () => {
    crId = await assessedMinorChange("Rinse longer at once: stains on the shipment", "95");
    const justification =
      "Water stains found on today's shipment; the customer line stops tonight.";
    const bad = emergencySchema.safeParse({
      ...(await signing(crId)),
      justification: "too short",
      approvalDueOn: "2026-02-30",
    });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues.map((i) => i.path[0]).sort()).toEqual([
      "approvalDueOn",
      "justification",
    ]);
    await expect(
      implementEmergency(people.engineer, {
        ...(await signing(crId)),
        justification,
        approvalDueOn: addDays(today, -1),
      }),
    ).rejects.toMatchObject({ field: "approvalDueOn", message: /cannot be in the past/ });
    await expect(
      implementEmergency(people.engineer, {
        ...(await signing(crId)),
        justification,
        approvalDueOn: addDays(today, 4),
      }),
    ).rejects.toMatchObject({ field: "approvalDueOn", message: /within 3 days/ });
    expect(
      await t.db.select().from(emergencyChanges).where(eq(emergencyChanges.changeRequestId, crId)),
    ).toEqual([]);
  });

  it("puts the proposed version in force at once, signed and audited, and tells the approvers", async () => {
    const state = await loadChangeState(t.db, crId);
    const before = (await t.db.select().from(emailOutbox)).length;
    await implementEmergency(
      people.engineer,
      {
        ...(await signing(crId)),
        justification: "Water stains found on today's shipment; the customer line stops tonight.",
        approvalDueOn: addDays(today, 3),
      },
      now,
    );
    expect((await versionStatus(state.toVersion.id)).status).toBe("effective");
    expect((await versionStatus(state.fromVersion!.id)).status).toBe("superseded");
    const [cr] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, crId));
    expect(cr.status).toBe("impact_assessed");
    const [sig] = await t.db
      .select()
      .from(signatures)
      .where(eq(signatures.recordId, `${crId}#emergency`));
    expect(sig).toMatchObject({ userId: people.engineer.id, meaning: "authored" });
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, crId), eq(auditEvents.action, "change.emergency_implemented")),
      );
    expect(event.reason).toMatch(/Water stains/);
    const mails = (await t.db.select().from(emailOutbox)).slice(before);
    expect(mails.map((m) => m.to)).toContain("approver@fennmoor.example");
    expect(mails[0].subject).toMatch(/Emergency change CR-\d{4}-\d{3} in force before approval/);
    await expect(
      reopenChange(people.engineer, { changeRequestId: crId, reason: "Edit the rinse" }),
    ).rejects.toThrow(/cannot be reopened/);
  });

  it("escalates an overdue approval once, to approvers and administrators, and lists it in their queue", async () => {
    // The demo's own emergency change (db/seed-change-types.ts) is three days overdue already.
    expect(await escalateOverdueEmergencyApprovals(now)).toBe(1);
    expect(await escalateOverdueEmergencyApprovals(new Date(now.getTime() + 3 * DAY))).toBe(0);
    const later = new Date(now.getTime() + 4 * DAY);
    const before = (await t.db.select().from(emailOutbox)).length;
    expect(await escalateOverdueEmergencyApprovals(later)).toBe(1);
    const mails = (await t.db.select().from(emailOutbox)).slice(before);
    expect(new Set(mails.map((m) => m.to))).toEqual(
      new Set(["approver@fennmoor.example", "admin@fennmoor.example"]),
    );
    expect(mails[0].subject).toMatch(/approval overdue/);
    expect(await escalateOverdueEmergencyApprovals(new Date(later.getTime() + DAY))).toBe(0);

    const admin = { ...people.admin, roles: ["admin"] } as never;
    const mine = <T extends { href: string }>(items: T[]) =>
      items.filter((i) => i.href === `/changes/${crId}`);
    const overdue = mine((await emergencyQueueProvider(admin, later)).items);
    expect(overdue).toHaveLength(1);
    expect(overdue[0]).toMatchObject({ kind: "Emergency approval overdue" });
    expect(overdue[0].title).toMatch(/^Emergency · CR-/);
    expect(mine((await emergencyQueueProvider(admin, now)).items)).toEqual([]);
    const technician = { ...people.technician, roles: ["technician"] } as never;
    expect((await emergencyQueueProvider(technician, later)).items).toEqual([]);
    const approver = { ...people.approver, roles: ["approver"] } as never;
    const approval = (await changeQueueProvider(approver, now)).items.find(
      (i) => i.href === `/changes/${crId}`,
    );
    expect(approval?.title).toMatch(/^Emergency · /);
  });

  it("closes only once each affected document is revised or confirmed unaffected; the version stays in force", async () => {
    const state = await loadChangeState(t.db, crId);
    const effectiveFrom = (await versionStatus(state.toVersion.id)).effectiveFrom;
    await approveChange(people.approver, await signing(crId));
    expect(await escalateOverdueEmergencyApprovals(new Date(now.getTime() + 9 * DAY))).toBe(0);
    await verifyChange(people.reviewer, await signing(crId));
    const [doc] = await listControlledDocuments(t.db);
    await addAffectedDocument(people.engineer, { changeRequestId: crId, documentId: doc.id });
    await expect(
      addAffectedDocument(people.engineer, { changeRequestId: crId, documentId: doc.id }),
    ).rejects.toMatchObject({ field: "documentId" });
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      new RegExp(`Missing: ${doc.number} `),
    );
    expect(
      unaffectedSchema.safeParse({ changeRequestId: crId, documentId: doc.id, reason: "  " })
        .success,
    ).toBe(false);
    await confirmDocumentUnaffected(people.engineer, {
      changeRequestId: crId,
      documentId: doc.id,
      reason: "Quotes the rinse time by reference to the recipe only.",
    });
    await closeChange(people.approver, { changeRequestId: crId });
    const after = await versionStatus(state.toVersion.id);
    expect(after).toMatchObject({ status: "effective", effectiveFrom });
    const [check] = await t.db
      .select()
      .from(changeEffectivenessChecks)
      .where(eq(changeEffectivenessChecks.changeRequestId, crId));
    expect(check).toMatchObject({ requiredRuns: 3, outcome: null });
  });

  it("counts the first verified runs on the new version and records a failed check once", async () => {
    const state = await loadChangeState(t.db, crId);
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-VB-210"));
    const at = (ms: number) => new Date(Date.now() + ms).toISOString();
    const run = async (number: string, outcome: "pass" | "fail", verifiedAt: string) => {
      const [r] = await t.db
        .insert(testRuns)
        .values({
          number,
          partFamilyId: family.id,
          recipeVersionId: state.toVersion.id,
          testType: "particle_cleanliness",
          status: "verified",
          outcome,
          createdBy: people.technician.id,
        })
        .returning();
      await t.db.insert(signatures).values({
        recordType: "test_run",
        recordId: r.id,
        userId: people.reviewer.id,
        printedName: people.reviewer.name,
        meaning: "verified",
        signedAt: verifiedAt,
        contentHash: "0".repeat(64),
      });
    };
    await run("TR-EFF-001", "pass", at(60_000));
    expect((await loadEffectiveness(t.db, [crId])).get(crId)).toMatchObject({
      state: "pending",
      passed: 1,
      required: 3,
    });
    expect(await recordEffectivenessOutcomes()).toBe(0);
    await run("TR-EFF-002", "fail", at(120_000));
    expect(await recordEffectivenessOutcomes()).toBe(1);
    const [check] = await t.db
      .select()
      .from(changeEffectivenessChecks)
      .where(eq(changeEffectivenessChecks.changeRequestId, crId));
    expect(check).toMatchObject({ outcome: "failed", runs: ["TR-EFF-001", "TR-EFF-002"] });
    const failed = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, crId), eq(auditEvents.action, "change.effectiveness_failed")),
      );
    expect(failed).toHaveLength(1);
    // The failure opened its nonconformance, raised by the system, on the change's recipe and the
    // failed run's part family, with the failed run in its containment.
    const [cr] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, crId));
    const ncs = await t.db
      .select()
      .from(nonconformances)
      .where(
        and(
          eq(nonconformances.sourceKind, "change_effectiveness"),
          eq(nonconformances.sourceId, crId),
        ),
      );
    expect(ncs).toHaveLength(1);
    expect(ncs[0]).toMatchObject({
      sourceLabel: cr.number,
      recipeId: cr.recipeId,
      partFamilyId: family.id,
      openedBy: null,
      detectedOn: todayUtc(),
    });
    const items = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, ncs[0].id));
    expect(items.map((i) => i.label)).toContain("TR-EFF-002");
    const [raised] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, ncs[0].id), eq(auditEvents.action, "nonconformance.raised")),
      );
    expect(raised).toMatchObject({ actorId: null, actorName: "system" });
    expect(await recordEffectivenessOutcomes()).toBe(0);
    expect(
      await t.db.select().from(nonconformances).where(eq(nonconformances.sourceId, crId)),
    ).toHaveLength(1);
  });

  it("a rejected emergency change puts the previous version back in force", async () => {
    await setChangeControlSettings(people.admin, {
      emergencyApprovalDays: 1,
      effectivenessRuns: 3,
    });
    const id = await assessedMinorChange("Rinse longer still", "100");
    const state = await loadChangeState(t.db, id);
    await expect(
      implementEmergency(people.engineer, {
        ...(await signing(id)),
        justification: "Stains again on the evening shift; cannot wait for the approver.",
        approvalDueOn: addDays(todayUtc(), 2),
      }),
    ).rejects.toMatchObject({ field: "approvalDueOn", message: /within 1 day:/ });
    await implementEmergency(people.engineer, {
      ...(await signing(id)),
      justification: "Stains again on the evening shift; cannot wait for the approver.",
      approvalDueOn: addDays(todayUtc(), 1),
    });
    expect((await versionStatus(state.fromVersion!.id)).status).toBe("superseded");
    await endChange(people.approver, {
      changeRequestId: id,
      reason: "The longer rinse overloads the dryer.",
      how: "reject",
    });
    expect((await versionStatus(state.toVersion.id)).status).toBe("withdrawn");
    expect(await versionStatus(state.fromVersion!.id)).toMatchObject({
      status: "effective",
      effectiveTo: null,
    });
  });
});
