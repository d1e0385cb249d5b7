import { can } from "@/lib/auth/permissions";
import { and, desc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeRequests,
  cleanlinessSpecs,
  documentVersions,
  emailOutbox,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  signatures,
  testSamples,
  testRuns,
  userRoles,
  users,
  type TestRun,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import type { RichDoc } from "@/lib/documents/rich-text";
import { narrativeDocument } from "@/lib/changes/content";
import { proposalSchema } from "@/lib/schemas/change";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { makeDueVersionsEffective } from "@/lib/server/documents/make-effective";
import { startNewVersion } from "@/lib/server/documents/start-new-version";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { linkEvidence } from "@/lib/server/changes/link-evidence";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { changeQueueProvider } from "@/lib/server/changes/queue-provider";
import { reopenChange } from "@/lib/server/changes/reopen-change";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { setRequalificationInterval } from "@/lib/server/changes/set-requalification-interval";
import { sendRequalificationReminders } from "@/lib/server/changes/send-requalification-reminders";
import { startRequalification } from "@/lib/server/changes/start-requalification";
import { loadChangeState } from "@/lib/server/changes/state";
import { getChangeRequestHeading, getChangeRequestPage } from "@/lib/server/changes/queries";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { customerDecisionSchema } from "@/lib/schemas/change-types";
import { recordCustomerDecision } from "@/lib/server/changes/customer-approval";
import { storeCustomerLetter } from "@/lib/server/changes/store-customer-letter";
import { versionMatrix } from "@/lib/server/matrix/version-matrix";
import { createRun } from "@/lib/server/evidence/create-run";
import { reviseRun } from "@/lib/server/evidence/revise-run";
import { runContent } from "@/lib/server/evidence/run-content";
import { getPartFamilyHistory } from "@/lib/server/trace/part-family-history";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};

async function user(email: string) {
  const [u] = await t.db.select().from(users).where(eq(users.email, email));
  return { id: u.id, name: u.name };
}

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "reviewer", "technician", "admin"])
    people[role] = await user(`${role}@fennmoor.example`);
});
afterAll(() => t.cleanup());

async function proposalFor(
  changeRequestId: string,
  edit: (p: Record<string, unknown>) => void,
  extra: Record<string, unknown> = {},
) {
  return proposalForm(await loadChangeState(t.db, changeRequestId), edit, extra);
}

/** The justification, saved through the documents editor's own service. */
async function writeNarrative(changeRequestId: string, text: string) {
  const s = await loadChangeState(t.db, changeRequestId);
  await saveDraft(
    { ...people.engineer, roles: ["engineer"] },
    {
      versionId: s.narrative!.id,
      lockVersion: s.narrative!.lockVersion,
      content: narrativeDocument(text) as RichDoc,
      overwrite: false,
    },
  );
}

const signing = async (id: string) => ({
  changeRequestId: id,
  password: DEMO_PASSWORD,
  contentHash: (await loadChangeState(t.db, id)).contentHash,
});

async function addRun(input: {
  crId: string;
  versionId: string;
  testType: TestRun["testType"];
  number: string;
  samples: number;
  outcome: TestRun["outcome"];
  status: TestRun["status"];
  performer?: string;
  verifier?: string;
}) {
  const [family] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  const [run] = await t.db
    .insert(testRuns)
    .values({
      number: input.number,
      partFamilyId: family.id,
      recipeVersionId: input.versionId,
      testType: input.testType,
      status: input.status,
      outcome: input.outcome,
      createdBy: people.technician.id,
    })
    .returning();
  await t.db.insert(testSamples).values(
    Array.from({ length: input.samples }, (_, i) => ({
      runId: run.id,
      sampleLabel: `S${i + 1}`,
      // Spread over three wash cycles, as the gate asks of independent samples.
      cycleNumber: `C${(i % 3) + 1}`,
      data: { counts: {} },
    })),
  );
  const at = new Date().toISOString();
  if (input.performer)
    await t.db.insert(signatures).values({
      recordType: "test_run",
      recordId: run.id,
      userId: input.performer,
      printedName: "p",
      meaning: "performed",
      signedAt: at,
      contentHash: "h",
    });
  if (input.verifier)
    await t.db.insert(signatures).values({
      recordType: "test_run",
      recordId: run.id,
      userId: input.verifier,
      printedName: "v",
      meaning: "verified",
      signedAt: at,
      contentHash: "h",
    });
  return run;
}

describe("periodic requalification", () => {
  it("sends a reminder once for a requalification falling due within 30 days, and lists it in My queue", async () => {
    const before = (await t.db.select().from(emailOutbox)).length;
    expect(await sendRequalificationReminders()).toBeGreaterThanOrEqual(1);
    const mails = (await t.db.select().from(emailOutbox)).slice(before);
    expect(
      mails.some(
        (m) => m.subject.includes("Requalification due") && m.to === "engineer@fennmoor.example",
      ),
    ).toBe(true);
    expect(await sendRequalificationReminders()).toBe(0);
    const engineer = {
      ...people.engineer,
      email: "engineer@fennmoor.example",
      roles: ["engineer" as const],
      mustChangePassword: false,
    };
    const items = (await changeQueueProvider(engineer as never, new Date())).items;
    expect(
      items.some(
        (i) => i.kind === "Requalification due" && i.title.startsWith("R-SC1-SF") === false,
      ),
    ).toBe(true);
    const technician = {
      ...people.technician,
      email: "technician@fennmoor.example",
      roles: ["technician" as const],
      mustChangePassword: false,
    };
    const techItems = (await changeQueueProvider(technician as never, new Date())).items;
    const tests = techItems.find((i) => i.title.startsWith("CR-2026-002"));
    expect(tests?.kind).toBe("Requalification tests");
    // The technician may not open change requests: the item opens the run form for the change.
    expect(can(technician.roles, "changes.view")).toBe(false);
    expect(tests?.href).toMatch(
      /^\/evidence\/runs\/new\?change=[0-9a-f-]{36}&testType=\w+&samples=\d+$/,
    );
  });
});

describe("a change request whose page cannot be built", () => {
  it("is refused with its reason, not as missing, and can still be named", async () => {
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.status, "closed"))
      .limit(1);
    // A change whose proposed version is gone: the page cannot compare versions.
    await t.db
      .update(changeRequests)
      .set({ toVersionId: null })
      .where(eq(changeRequests.id, cr.id));
    try {
      await expect(getChangeRequestPage(cr.id)).rejects.toMatchObject({
        kind: "conflict",
        message: "This change request has no recipe versions to compare.",
      });
      expect(await getChangeRequestHeading(cr.id)).toMatchObject({
        number: cr.number,
        title: cr.title,
        status: "closed",
        createdAt: cr.createdAt,
      });
      await expect(getChangeRequestPage(crypto.randomUUID())).rejects.toMatchObject({
        kind: "not_found",
      });
      expect(await getChangeRequestHeading(crypto.randomUUID())).toBeNull();
    } finally {
      await t.db
        .update(changeRequests)
        .set({ toVersionId: cr.toVersionId })
        .where(eq(changeRequests.id, cr.id));
    }
  });
});

describe("requalification interval", () => {
  it("changes with a reason, refuses the same value, and re-arms the reminder", async () => {
    const [row] = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.intervalMonths, 12));
    await expect(
      setRequalificationInterval(people.engineer, {
        intervalId: row.id,
        intervalMonths: 12,
        reason: "No change",
      }),
    ).rejects.toMatchObject({ field: "intervalMonths" });
    await setRequalificationInterval(people.engineer, {
      intervalId: row.id,
      intervalMonths: 6,
      reason: "Customer asks for half-yearly checks",
    });
    const [after] = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.id, row.id));
    expect(after).toMatchObject({ intervalMonths: 6, notifiedForDue: null });
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, row.id))
      .orderBy(desc(auditEvents.seq))
      .limit(1);
    expect(event).toMatchObject({
      action: "requalification_interval.set",
      reason: "Customer asks for half-yearly checks",
    });
    await setRequalificationInterval(people.engineer, {
      intervalId: row.id,
      intervalMonths: 12,
      reason: "Back to yearly",
    });
  });
});

describe("a major change from proposal to closure", () => {
  let crId = "";
  let toVersionId = "";
  let recipeId = "";

  it("opens against the effective version with a proposed copy, and refuses a second open change", async () => {
    const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    recipeId = recipe.id;
    const cr = await openChangeRequest(people.engineer, {
      recipeId,
      title: "Wash valve bodies at 70 °C",
      kind: "parameter_change",
    });
    crId = cr.id;
    toVersionId = cr.toVersionId!;
    const [v] = await t.db.select().from(recipeVersions).where(eq(recipeVersions.id, toVersionId));
    expect(v).toMatchObject({ version: 3, status: "proposed" });
    await expect(
      openChangeRequest(people.engineer, {
        recipeId,
        title: "Another change",
        kind: "parameter_change",
      }),
    ).rejects.toThrow(/already open/);
  });

  it("computes major with the matrix's tests and sample sizes when the wash temperature leaves its range", async () => {
    const input = proposalSchema.parse(
      await proposalFor(crId, (p) => p.key === "wash.temperature" && (p.setpoint = "70")),
    );
    await saveProposal(people.engineer, input);
    const s = await loadChangeState(t.db, crId);
    expect(s.assessment.computed).toBe("major");
    // Success run, C 95 % / R 90 % → 29 [derived, standards.md §4].
    expect(s.requirements.map((r) => [r.testType, r.samples])).toEqual([
      ["gravimetric", 29],
      ["particle_cleanliness", 29],
    ]);
  });

  it("refuses to lower the class below the computed one", async () => {
    const input = proposalSchema.parse(
      await proposalFor(crId, (p) => p.key === "wash.temperature" && (p.setpoint = "70"), {
        raiseTo: "minor",
        raiseReason: "I think it is fine",
      }),
    );
    await expect(saveProposal(people.engineer, input)).rejects.toMatchObject({ field: "raiseTo" });
  });

  it("signs authored at submission; the author may not approve; an approver does", async () => {
    await expect(assessChange(people.engineer, await signing(crId))).rejects.toThrow(
      /Write the justification/,
    );
    await writeNarrative(crId, "Heavier chip load.\n\nRisk: burns at the tank; requalify.");
    // Submitting the narrative as a document would route it for approval apart from its change.
    const draft = (await loadChangeState(t.db, crId)).narrative!;
    const [v] = await t.db.select().from(documentVersions).where(eq(documentVersions.id, draft.id));
    const submit = {
      versionId: v.id,
      lockVersion: v.lockVersion,
      contentHash: v.contentHash ?? "",
      reviewerIds: [people.reviewer.id],
      approverId: people.approver.id,
      routing: "sequence" as const,
      dueDate: null,
      password: DEMO_PASSWORD,
    };
    await expect(
      submitForReview({ ...people.engineer, roles: ["engineer"] }, submit),
    ).rejects.toThrow(/moves only with its change request/);
    await assessChange(people.engineer, await signing(crId));
    const [cr] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, crId));
    expect(cr).toMatchObject({ status: "impact_assessed", impact: "major" });
    // The signed justification is frozen with the assessment.
    await expect(writeNarrative(crId, "Changed after signing")).rejects.toThrow();
    await expect(approveChange(people.engineer, await signing(crId))).rejects.toThrow(
      /another person/,
    );
    await approveChange(people.approver, await signing(crId));
    await startRequalification(people.engineer, { changeRequestId: crId });
    const mails = await t.db.select().from(emailOutbox);
    expect(
      mails.some(
        (m) => m.to === "approver@fennmoor.example" && m.subject.includes("impact assessed"),
      ),
    ).toBe(true);
    expect(
      mails.some(
        (m) =>
          m.to === "technician@fennmoor.example" &&
          m.text.includes("Particle cleanliness on 29 parts"),
      ),
    ).toBe(true);
  });

  it("the change narrative moves only with its change request: the document workflow refuses to revise it, and the date timer leaves it alone", async () => {
    const s = await loadChangeState(t.db, crId);
    const [narrative] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, s.narrative!.id));
    expect(narrative.status).toBe("approved");
    const engineer = { ...people.engineer, roles: ["engineer" as const] };
    await expect(
      startNewVersion(engineer, { documentId: narrative.documentId, reason: "Rewrite on its own" }),
    ).rejects.toThrow(/moves only with its change request/);
    // An effective date that has come would otherwise make it effective while the change is still being requalified.
    await t.db
      .update(documentVersions)
      .set({ effectiveDate: "2026-01-01" })
      .where(eq(documentVersions.id, narrative.id));
    await makeDueVersionsEffective(new Date("2026-06-01T00:00:00Z"));
    const [after] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, narrative.id));
    expect(after.status).toBe("approved");
    await t.db
      .update(documentVersions)
      .set({ effectiveDate: narrative.effectiveDate })
      .where(eq(documentVersions.id, narrative.id));
  });

  it("refuses verification and closure with each requirement missing in turn, naming exactly what is missing", async () => {
    await expect(verifyChange(people.reviewer, await signing(crId))).rejects.toThrow(
      /Missing: Gravimetric residue \(29 samples\): no test run linked; Particle cleanliness \(29 samples\): no test run linked/,
    );
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      /no test run linked/,
    );

    const s = await loadChangeState(t.db, crId);
    const reqs = (await import("@/lib/server/changes/snapshot")).loadGate;
    const { requirements } = await reqs(t.db, crId);
    const particle = requirements.find((r) => r.testType === "particle_cleanliness")!;
    const gravimetric = requirements.find((r) => r.testType === "gravimetric")!;
    const tech = people.technician.id;
    const eng = people.engineer.id;

    const good = await addRun({
      crId,
      versionId: toVersionId,
      testType: "gravimetric",
      number: "T-G1",
      samples: 29,
      outcome: "pass",
      status: "verified",
      performer: tech,
      verifier: eng,
    });
    await linkEvidence(people.engineer, {
      changeRequestId: crId,
      requirementId: gravimetric.id,
      testRunId: good.id,
    });

    const cases = [
      {
        number: "T-P1",
        samples: 29,
        outcome: "fail" as const,
        status: "verified" as const,
        performer: tech,
        verifier: eng,
        missing: "T-P1 computed outcome is fail, not pass",
      },
      {
        number: "T-P2",
        samples: 20,
        outcome: "pass" as const,
        status: "verified" as const,
        performer: tech,
        verifier: eng,
        missing: "T-P2 has 20 samples, 29 required",
      },
      {
        number: "T-P3",
        samples: 29,
        outcome: "pass" as const,
        status: "performed" as const,
        performer: tech,
        verifier: undefined,
        missing: "T-P3 is not verified by a second person",
      },
      {
        number: "T-P4",
        samples: 29,
        outcome: "pass" as const,
        status: "verified" as const,
        performer: tech,
        verifier: tech,
        missing: "T-P4 is not verified by a second person",
      },
    ];
    for (const c of cases) {
      const run = await addRun({
        crId,
        versionId: toVersionId,
        testType: "particle_cleanliness",
        ...c,
      });
      await linkEvidence(people.engineer, {
        changeRequestId: crId,
        requirementId: particle.id,
        testRunId: run.id,
      });
      const refusal = verifyChange(people.reviewer, await signing(crId));
      await expect(refusal).rejects.toThrow(c.missing);
      await expect(refusal).rejects.not.toThrow(/Gravimetric/);
    }
    // Evidence on another version, or of another test type, is refused outright.
    const other = await addRun({
      crId,
      versionId: s.fromVersion!.id,
      testType: "particle_cleanliness",
      number: "T-X1",
      samples: 29,
      outcome: "pass",
      status: "verified",
      performer: tech,
      verifier: eng,
    });
    await expect(
      linkEvidence(people.engineer, {
        changeRequestId: crId,
        requirementId: particle.id,
        testRunId: other.id,
      }),
    ).rejects.toThrow(/another recipe version/);
    await expect(
      linkEvidence(people.engineer, {
        changeRequestId: crId,
        requirementId: particle.id,
        testRunId: good.id,
      }),
    ).rejects.toThrow(/not a particle cleanliness test/);
  });

  it("passes once every requirement is met, and closing leaves exactly one effective version", async () => {
    const { loadGate } = await import("@/lib/server/changes/snapshot");
    const particle = (await loadGate(t.db, crId)).requirements.find(
      (r) => r.testType === "particle_cleanliness",
    )!;
    const run = await addRun({
      crId,
      versionId: toVersionId,
      testType: "particle_cleanliness",
      number: "T-P5",
      samples: 30,
      outcome: "pass",
      status: "verified",
      performer: people.technician.id,
      verifier: people.reviewer.id,
    });
    const signedHash = (await runContent(t.db, run)).hash;
    await linkEvidence(people.technician, {
      changeRequestId: crId,
      requirementId: particle.id,
      testRunId: run.id,
    });
    // The link is a row of its own: the signed run is not touched, so its signatures still bind.
    const [after] = await t.db.select().from(testRuns).where(eq(testRuns.id, run.id));
    expect(after.changeRequestId).toBeNull();
    expect((await runContent(t.db, after)).hash).toBe(signedHash);
    expect((await loadGate(t.db, crId)).gate.holds).toBe(true);
    // The gate holds, but a requalifying change is closed only once a second person has verified it.
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      "Verify the change first: a second person signs it verified, and only then is it closed and made effective.",
    );
    expect(
      (await t.db.select().from(changeRequests).where(eq(changeRequests.id, crId)))[0].status,
    ).toBe("requalification");
    await verifyChange(people.reviewer, await signing(crId));
    // CS-VB-01 says its customer approves process changes: a major change waits for that decision.
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      "Not made effective: the customer must approve this major change first. CS-VB-01 rev C (Harrowgate Injection Systems): the customer's decision is not recorded.",
    );
    const [spec] = await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(and(eq(cleanlinessSpecs.code, "CS-VB-01"), eq(cleanlinessSpecs.status, "in_force")));
    const letter = await storeCustomerLetter(people.engineer, {
      name: "HIS change approval.pdf",
      bytes: new TextEncoder().encode(
        "%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n",
      ),
    });
    const decision = {
      changeRequestId: crId,
      specId: spec.id,
      decidedOn: "2026-11-20",
      reference: "HIS-QA-2026-114",
      letterFileId: letter.id,
    };
    expect(
      customerDecisionSchema
        .safeParse({ ...decision, decision: "approved", letterFileId: "", reference: "" })
        .error?.issues.map((i) => i.path[0])
        .sort(),
    ).toEqual(["letterFileId", "reference"]);
    await recordCustomerDecision(people.engineer, { ...decision, decision: "rejected" });
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      "the customer rejected this change on 2026-11-20 (HIS-QA-2026-114)",
    );
    await recordCustomerDecision(people.engineer, { ...decision, decision: "approved" });
    await closeChange(people.approver, { changeRequestId: crId });

    const versions = await t.db
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, recipeId));
    expect(versions.filter((v) => v.status === "effective").map((v) => v.version)).toEqual([3]);
    expect(versions.find((v) => v.version === 2)?.status).toBe("superseded");
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, toVersionId));
    expect(events.map((e) => e.action)).toContain("recipe_version.effective");
    const [interval] = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.recipeVersionId, toVersionId));
    expect(interval.intervalMonths).toBe(12);
  });

  it("the database itself refuses a second effective version", async () => {
    const [v2] = await t.db
      .select()
      .from(recipeVersions)
      .where(and(eq(recipeVersions.recipeId, recipeId), eq(recipeVersions.version, 2)));
    await expect(
      t.db.update(recipeVersions).set({ status: "effective" }).where(eq(recipeVersions.id, v2.id)),
    ).rejects.toThrow();
  });
});

describe("reopening and revisions", () => {
  it("reopening starts a new revision: earlier signatures stay with the earlier revision, and the author may sign again", async () => {
    const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    const cr = await openChangeRequest(people.engineer, {
      recipeId: recipe.id,
      title: "Shorter rinse",
      kind: "parameter_change",
    });
    await saveProposal(
      people.engineer,
      proposalSchema.parse(
        await proposalFor(cr.id, (p) => p.key === "rinse.time" && (p.setpoint = "80")),
      ),
    );
    expect((await loadChangeState(t.db, cr.id)).impact).toBe("minor");
    await writeNarrative(cr.id, "Shorter rinse is enough for the lighter parts.");
    await assessChange(people.engineer, await signing(cr.id));
    await reopenChange(people.engineer, {
      changeRequestId: cr.id,
      reason: "Add the customer's note",
    });
    const s = await loadChangeState(t.db, cr.id);
    expect(s.signatureRecordId).toBe(`${cr.id}#2`);
    await assessChange(people.engineer, await signing(cr.id));
    const sigs = await t.db
      .select()
      .from(signatures)
      .where(eq(signatures.userId, people.engineer.id));
    expect(
      sigs
        .filter((x) => x.recordId.startsWith(cr.id))
        .map((x) => x.recordId)
        .sort(),
    ).toEqual([`${cr.id}#1`, `${cr.id}#2`]);
    // A minor change has no tests: approval, then verification, then closure.
    await approveChange(people.approver, await signing(cr.id));
    await expect(startRequalification(people.engineer, { changeRequestId: cr.id })).rejects.toThrow(
      /no requalification tests/,
    );
    await verifyChange(people.reviewer, await signing(cr.id));
    await closeChange(people.approver, { changeRequestId: cr.id });
  });

  it("one person holding several roles takes one duty per change: an approver who also reviews cannot verify, a verifier cannot close", async () => {
    await t.db.insert(userRoles).values({ userId: people.approver.id, role: "reviewer" });
    const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    const cr = await openChangeRequest(people.engineer, {
      recipeId: recipe.id,
      title: "Rinse a little longer",
      kind: "parameter_change",
    });
    await saveProposal(
      people.engineer,
      proposalSchema.parse(
        await proposalFor(cr.id, (p) => p.key === "rinse.time" && (p.setpoint = "95")),
      ),
    );
    await writeNarrative(cr.id, "Longer rinse for the heavier chip load.");
    await assessChange(people.engineer, await signing(cr.id));
    await approveChange(people.approver, await signing(cr.id));
    await expect(verifyChange(people.approver, await signing(cr.id))).rejects.toThrow(
      'Segregation of duties: you signed this record as "approved", so another person must sign it as "verified".',
    );
    await verifyChange(people.reviewer, await signing(cr.id));
    await expect(closeChange(people.reviewer, { changeRequestId: cr.id })).rejects.toThrow(
      'Segregation of duties: you signed this change as "verified", so another person must close it.',
    );
    await expect(closeChange(people.engineer, { changeRequestId: cr.id })).rejects.toThrow(
      /as "authored"/,
    );
    await closeChange(people.approver, { changeRequestId: cr.id });
    expect(
      (await t.db.select().from(changeRequests).where(eq(changeRequests.id, cr.id)))[0].status,
    ).toBe("closed");
  });
});

describe("bad input on the proposal", () => {
  it("names each impossible value at its own field", async () => {
    const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    const cr = await openChangeRequest(people.engineer, {
      recipeId: recipe.id,
      title: "Bad values",
      kind: "parameter_change",
    });
    const raw = await proposalFor(cr.id, (p) => {
      if (p.key === "wash.temperature") p.setpoint = "105";
      if (p.key === "wash.time") p.setpoint = "-30";
      if (p.key === "rinse.spray_pressure")
        Object.assign(p, { validatedLow: "5", validatedHigh: "2" });
      if (p.key === "wash.concentration") p.unit = "bar";
    });
    const result = proposalSchema.safeParse(raw);
    expect(result.success).toBe(false);
    const paths = Object.fromEntries(
      result.error!.issues.map((i) => [i.path.join("."), i.message]),
    );
    expect(paths["recipe.stages.0.parameters.0.setpoint"]).toMatch(/boils/);
    expect(paths["recipe.stages.0.parameters.1.setpoint"]).toMatch(/negative/);
    expect(paths["recipe.stages.0.parameters.2.unit"]).toMatch(/not "bar"/);
    expect(paths["recipe.stages.1.parameters.2.validatedLow"]).toMatch(/above the validated high/);
  });
});

describe("requalification matrix", () => {
  it("versions the matrix and keeps one in force", async () => {
    const m = await versionMatrix(people.admin, {
      note: "Stricter drying tests",
      rows: [
        {
          subject: "parameter:drying_temperature",
          testType: "dryness",
          confidencePct: 95,
          reliabilityPct: 95,
        },
      ],
    });
    expect(m.version).toBe(2);
    const { getEffectiveMatrix } = await import("@/lib/server/changes/state");
    const eff = await getEffectiveMatrix(t.db);
    expect(eff?.version).toBe(2);
    expect(eff?.rows).toHaveLength(1);
  });
});

describe("evidence tied to a change request", () => {
  it("a run is tied only on the proposed version of an open change, and a tie on another version does not count", async () => {
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.number, "CR-2026-002"));
    const [closed] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.number, "CR-2026-001"));
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-PH-400"));
    const run = (recipeVersionId: string, changeRequestId: string) =>
      createRun(people.technician, {
        partFamilyId: family.id,
        recipeVersionId,
        testType: "particle_cleanliness",
        technicianId: people.technician.id,
        lab: "Lab",
        performedOn: "2026-11-30",
        changeRequestId,
      });
    await expect(run(cr.fromVersionId!, cr.id)).rejects.toMatchObject({
      field: "changeRequestId",
      message:
        "CR-2026-002 is requalified on R-AW3-PH v2: choose that recipe version, or no change request.",
    });
    await expect(run(closed.toVersionId!, closed.id)).rejects.toMatchObject({
      field: "changeRequestId",
      message: /waiting for requalification evidence/,
    });

    // A run tied on the version in force (written as data) is no evidence for the proposal.
    await addRun({
      crId: cr.id,
      versionId: cr.fromVersionId!,
      testType: "particle_cleanliness",
      number: "T-OLD",
      samples: 29,
      outcome: "pass",
      status: "verified",
      performer: people.technician.id,
      verifier: people.engineer.id,
    }).then((r) =>
      t.db.update(testRuns).set({ changeRequestId: cr.id }).where(eq(testRuns.id, r.id)),
    );
    const { loadGate } = await import("@/lib/server/changes/snapshot");
    expect((await loadGate(t.db, cr.id)).gate.missing).toContain(
      "Particle cleanliness (29 samples): no test run linked",
    );

    const tied = await run(cr.toVersionId!, cr.id);
    expect((await loadGate(t.db, cr.id)).gate.missing).toContain(
      `Particle cleanliness (29 samples): ${tied.number} computed outcome is incomplete, not pass`,
    );
  });

  it("a corrected run keeps the links of the revision it replaces", async () => {
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.number, "CR-2026-002"));
    const { loadGate } = await import("@/lib/server/changes/snapshot");
    const gravimetric = (await loadGate(t.db, cr.id)).requirements.find(
      (r) => r.testType === "gravimetric",
    )!;
    const run = await addRun({
      crId: cr.id,
      versionId: cr.toVersionId!,
      testType: "gravimetric",
      number: "T-GR",
      samples: 29,
      outcome: "pass",
      status: "verified",
      performer: people.technician.id,
      verifier: people.engineer.id,
    });
    await linkEvidence(people.technician, {
      changeRequestId: cr.id,
      requirementId: gravimetric.id,
      testRunId: run.id,
    });
    const next = await reviseRun(people.technician, {
      runId: run.id,
      reason: "Balance recalibrated",
    });
    const linked = (await loadGate(t.db, cr.id)).linked.get(gravimetric.id)!.map((r) => r.id);
    expect(linked).toEqual(expect.arrayContaining([run.id, next.id]));
    // The part family's history names the change a linked run answers, though the run itself was not tied.
    const history = await getPartFamilyHistory(run.partFamilyId);
    const listed = history!.versions.flatMap((v) => v.runs).filter((r) => r.number === "T-GR");
    expect(listed.map((r) => [r.revision, r.changeNumber])).toEqual([
      [1, "CR-2026-002"],
      [2, "CR-2026-002"],
    ]);
  });
});
