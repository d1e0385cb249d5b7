import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  partFamilies,
  recipeVersions,
  requalificationIntervals,
  signatures,
  testRuns,
  testSamples,
  users,
  type TestRun,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import type { RichDoc } from "@/lib/documents/rich-text";
import { narrativeDocument } from "@/lib/changes/content";
import { openChangeSchema, proposalSchema } from "@/lib/schemas/change";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { endChange } from "@/lib/server/changes/end-change";
import { linkEvidence } from "@/lib/server/changes/link-evidence";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { openInitialValidation } from "@/lib/server/changes/open-initial-validation";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { startRequalification } from "@/lib/server/changes/start-requalification";
import { getRecipeVersionPage } from "@/lib/server/changes/queries";
import { loadChangeState } from "@/lib/server/changes/state";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { recordCustomerDecision } from "@/lib/server/changes/customer-approval";
import { storeCustomerLetter } from "@/lib/server/changes/store-customer-letter";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { createRun } from "@/lib/server/evidence/create-run";
import { createRecipe } from "@/lib/server/plant/create-recipe";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};
let familyId = "";
let otherFamilyId = "";

const param = (
  key: string,
  kind: string,
  setpoint: string,
  unit: string,
  low: string,
  high: string,
) => ({
  key,
  name: key,
  kind,
  setpoint,
  unit,
  validatedLow: low,
  validatedHigh: high,
  critical: true,
});
async function newRecipe(code: string) {
  const [system] = await t.db
    .select()
    .from(cleaningSystems)
    .where(eq(cleaningSystems.code, "AW-3"));
  return createRecipe(
    people.engineer,
    createRecipeSchema.parse({
      systemId: system.id,
      code,
      name: "Manifold block, ultrasonic",
      description: "",
      content: {
        detergent: "Alkaline cleaner AC-14",
        notes: "",
        stages: [
          {
            name: "Wash",
            kind: "wash",
            mode: "ultrasonic",
            parameters: [param("wash.temperature", "temperature", "60", "°C", "55", "65")],
          },
          {
            name: "Drying",
            kind: "drying",
            mode: "vacuum_drying",
            parameters: [
              param("drying.temperature", "drying_temperature", "110", "°C", "100", "120"),
            ],
          },
        ],
      },
    }),
  );
}
const signing = async (id: string) => ({
  changeRequestId: id,
  password: DEMO_PASSWORD,
  contentHash: (await loadChangeState(t.db, id)).contentHash,
});
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
/** A run of the required size and outcome, signed performed by the technician and verified by the engineer. */
async function verifiedRun(
  versionId: string,
  testType: TestRun["testType"],
  samples: number,
  number: string,
) {
  const [run] = await t.db
    .insert(testRuns)
    .values({
      number,
      partFamilyId: familyId,
      recipeVersionId: versionId,
      testType,
      status: "verified",
      outcome: "pass",
      createdBy: people.technician.id,
    })
    .returning();
  await t.db.insert(testSamples).values(
    Array.from({ length: samples }, (_, i) => ({
      runId: run.id,
      sampleLabel: `S${i + 1}`,
      // Parts from three washer cycles: the gate's usual minimum of independent washes [practice].
      cycleNumber: `${number}-C${(i % 3) + 1}`,
      data: { counts: {} },
    })),
  );
  const at = new Date().toISOString();
  await t.db.insert(signatures).values([
    {
      recordType: "test_run",
      recordId: run.id,
      userId: people.technician.id,
      printedName: "p",
      meaning: "performed",
      signedAt: at,
      contentHash: "h",
    },
    {
      recordType: "test_run",
      recordId: run.id,
      userId: people.engineer.id,
      printedName: "v",
      meaning: "verified",
      signedAt: at,
      contentHash: "h",
    },
  ]);
  return run;
}
const events = async (recordId: string) =>
  (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, recordId))).map(
    (e) => e.action,
  );

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "reviewer", "technician"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
  const families = await t.db.select().from(partFamilies);
  familyId = families.find((f) => f.code === "PF-VB-210")!.id;
  otherFamilyId = families.find((f) => f.code !== "PF-VB-210")!.id;
});
afterAll(() => t.cleanup());

describe("initial validation of a new recipe", () => {
  let recipeId = "";
  let versionId = "";
  let crId = "";

  it("opens only on a draft first version, with no 'from', and makes the draft the proposal", async () => {
    const { recipe, version } = await newRecipe("R-AW3-IV1");
    recipeId = recipe.id;
    versionId = version.id;
    // A change request needs an effective version; an initial validation is never opened as a change.
    await expect(
      openChangeRequest(people.engineer, {
        recipeId,
        title: "Tune the new recipe",
        kind: "parameter_change",
      }),
    ).rejects.toThrow(/no effective version/);
    expect(
      openChangeSchema.safeParse({ recipeId, title: "Validate it", kind: "initial_validation" })
        .success,
    ).toBe(false);

    const cr = await openInitialValidation(people.engineer, {
      recipeId,
      title: "Initial validation of R-AW3-IV1",
      partFamilyId: familyId,
    });
    crId = cr.id;
    expect(cr).toMatchObject({ fromVersionId: null, toVersionId: versionId, status: "draft" });
    const [v] = await t.db.select().from(recipeVersions).where(eq(recipeVersions.id, versionId));
    expect(v.status).toBe("proposed");
    expect(await events(versionId)).toContain("recipe_version.validation_opened");
    expect(await events(crId)).toContain("change.opened");
    await expect(
      openInitialValidation(people.engineer, {
        recipeId,
        title: "Second try",
        partFamilyId: familyId,
      }),
    ).rejects.toThrow(/already open/);
  });

  it("assesses the whole first version as major against nothing, with tests from the matrix and the part family named", async () => {
    const s = await loadChangeState(t.db, crId);
    expect(s.fromVersion).toBeNull();
    expect(s.impact).toBe("major");
    expect(s.assessment.diff.parameters.every((p) => p.change === "added")).toBe(true);
    expect(
      s.assessment.triggers.some((tr) =>
        tr.reason.includes("Initial validation of the recipe for PF-VB-210"),
      ),
    ).toBe(true);
    expect(s.requirements.length).toBeGreaterThan(0);
  });

  it("keeps its kind: the proposal cannot turn it into a change", async () => {
    const s = await loadChangeState(t.db, crId);
    const asChange = proposalSchema.parse(proposalForm(s, () => {}, { kind: "parameter_change" }));
    await expect(saveProposal(people.engineer, asChange)).rejects.toMatchObject({ field: "kind" });
    const missingFamily = proposalSchema.safeParse(
      proposalForm(s, () => {}, { kind: "initial_validation" }),
    );
    expect(missingFamily.success).toBe(false);
    const ok = proposalSchema.parse(
      proposalForm(s, (p) => p.key === "wash.temperature" && (p.setpoint = "62"), {
        kind: "initial_validation",
        partFamilyId: familyId,
      }),
    );
    await saveProposal(people.engineer, ok);
    expect((await loadChangeState(t.db, crId)).to.stages[0].parameters[0].setpoint).toBe(62);
  });

  it("refuses every step out of order and by the wrong person, and closes only when the evidence gate holds", async () => {
    // draft: nothing past assessment, and no assessment without a written rationale.
    await expect(approveChange(people.approver, await signing(crId))).rejects.toThrow(
      /cannot be approved/,
    );
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      /cannot be closed/,
    );
    await expect(assessChange(people.engineer, await signing(crId))).rejects.toMatchObject({
      field: "narrative",
    });
    await writeNarrative(
      crId,
      "First validation of the manifold recipe on AW-3: worst-case blocks in the basket corners.",
    );
    await assessChange(people.engineer, await signing(crId));
    // reviewed → approved: the author may not approve what they authored.
    await expect(approveChange(people.engineer, await signing(crId))).rejects.toThrow(
      /another person/,
    );
    await expect(verifyChange(people.reviewer, await signing(crId))).rejects.toThrow(
      /cannot be verified/,
    );
    await approveChange(people.approver, await signing(crId));
    await expect(verifyChange(people.reviewer, await signing(crId))).rejects.toThrow(
      /Start requalification first/,
    );
    await startRequalification(people.engineer, { changeRequestId: crId });

    // A run on the proposal for the family under validation opens; for another family it is refused.
    await expect(
      createRun(people.technician, {
        partFamilyId: otherFamilyId,
        recipeVersionId: versionId,
        testType: "gravimetric",
        technicianId: people.technician.id,
        lab: "Larchfield lab",
        performedOn: "2026-11-20",
        changeRequestId: crId,
      } as never),
    ).rejects.toThrow(/is not qualified on R-AW3-IV1 v1/);
    const opened = await createRun(people.technician, {
      partFamilyId: familyId,
      recipeVersionId: versionId,
      testType: "gravimetric",
      technicianId: people.technician.id,
      lab: "Larchfield lab",
      performedOn: "2026-11-20",
      changeRequestId: crId,
    } as never);
    expect(opened.id).toBeTruthy();

    // The gate: no verification or closure while evidence is missing.
    await expect(verifyChange(people.reviewer, await signing(crId))).rejects.toThrow(
      /no test run linked/,
    );
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      /no test run linked/,
    );
    const s = await loadChangeState(t.db, crId);
    const stored = await t.db.select().from(changeRequests).where(eq(changeRequests.id, crId));
    expect(stored[0].status).toBe("requalification");
    for (const [i, r] of s.requirements.entries()) {
      const run = await verifiedRun(versionId, r.testType, r.samples, `T-IV-${i}`);
      const { requirements } = await import("@/lib/server/changes/snapshot").then((m) =>
        m.loadGate(t.db, crId),
      );
      await linkEvidence(people.engineer, {
        changeRequestId: crId,
        requirementId: requirements.find((q) => q.testType === r.testType)!.id,
        testRunId: run.id,
      });
    }
    // Segregation of duties: the approver may not verify what they approved.
    await expect(verifyChange(people.approver, await signing(crId))).rejects.toThrow(
      /Segregation of duties/,
    );
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      /Verify the change first/,
    );
    await verifyChange(people.reviewer, await signing(crId));
    // The author may not close what they authored.
    await expect(closeChange(people.engineer, { changeRequestId: crId })).rejects.toThrow(
      'Segregation of duties: you signed this change as "authored", so another person must close it.',
    );
    // PF-VB-210's specification asks its customer to approve process changes, a new recipe included.
    await expect(closeChange(people.approver, { changeRequestId: crId })).rejects.toThrow(
      /the customer must approve this major change first\. CS-VB-01 rev C/,
    );
    const [spec] = await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(and(eq(cleanlinessSpecs.code, "CS-VB-01"), eq(cleanlinessSpecs.status, "in_force")));
    const letter = await storeCustomerLetter(people.engineer, {
      name: "HIS new recipe approval.pdf",
      bytes: new TextEncoder().encode(
        "%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n",
      ),
    });
    await recordCustomerDecision(people.engineer, {
      changeRequestId: crId,
      specId: spec.id,
      decision: "approved",
      decidedOn: "2026-11-20",
      reference: "HIS-QA-2026-120",
      letterFileId: letter.id,
    });
    await closeChange(people.approver, { changeRequestId: crId });
  });

  it("closing makes the first version effective and qualifies the part family it was validated for, audited", async () => {
    const [v] = await t.db.select().from(recipeVersions).where(eq(recipeVersions.id, versionId));
    expect(v.status).toBe("effective");
    expect(v.effectiveFrom).not.toBeNull();
    const qualified = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.recipeVersionId, versionId));
    expect(qualified.map((q) => q.partFamilyId)).toEqual([familyId]);
    expect(qualified[0]).toMatchObject({
      basis: expect.stringMatching(/^Initial validation CR-/),
      qualifiedBy: people.approver.id,
      intervalMonths: 12,
    });
    expect(await events(versionId)).toEqual(
      expect.arrayContaining(["recipe_version.validation_opened", "recipe_version.effective"]),
    );
    expect(await events(versionId)).not.toContain("recipe_version.superseded");
    expect(await events(crId)).toContain("change.closed");
    // The version opens read-only with its content in process order and the request that validated it.
    const page = (await getRecipeVersionPage(recipeId, 1))!;
    expect(page.content.stages.map((st) => st.kind)).toEqual(["wash", "drying"]);
    expect(page.proposedBy.map((c) => c.id)).toEqual([crId]);
    expect(await getRecipeVersionPage(recipeId, 2)).toBeUndefined();
    // Validated once: a second initial validation is refused; changes go through change control.
    await expect(
      openInitialValidation(people.engineer, { recipeId, title: "Again", partFamilyId: familyId }),
    ).rejects.toThrow(/validated already/);
  });

  it("withdrawn or rejected, the first version goes back to draft and can be routed again", async () => {
    const { recipe, version } = await newRecipe("R-AW3-IV2");
    const cr = await openInitialValidation(people.engineer, {
      recipeId: recipe.id,
      title: "Initial validation of R-AW3-IV2",
      partFamilyId: familyId,
    });
    await expect(
      endChange(people.engineer, {
        changeRequestId: cr.id,
        reason: "Wrong family",
        how: "withdraw",
      }),
    ).resolves.toBeUndefined();
    const [v] = await t.db.select().from(recipeVersions).where(eq(recipeVersions.id, version.id));
    expect(v.status).toBe("draft");
    expect(await events(version.id)).toContain("recipe_version.returned_to_draft");
    const again = await openInitialValidation(people.engineer, {
      recipeId: recipe.id,
      title: "Initial validation of R-AW3-IV2",
      partFamilyId: otherFamilyId,
    });
    await endChange(people.approver, {
      changeRequestId: again.id,
      reason: "Ranges too wide",
      how: "reject",
    });
    const [after] = await t.db
      .select()
      .from(recipeVersions)
      .where(and(eq(recipeVersions.recipeId, recipe.id), eq(recipeVersions.version, 1)));
    expect(after.status).toBe("draft");
    await expect(
      openInitialValidation(people.engineer, {
        recipeId: recipe.id,
        title: "Unknown family",
        partFamilyId: crypto.randomUUID(),
      }),
    ).rejects.toMatchObject({ field: "partFamilyId" });
  });
});
