import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import {
  auditEvents,
  changeRequestAssessments,
  documentVersions,
  emailOutbox,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  signatures,
  users,
  type Role,
} from "@/db/schema";
import { canonicalJson, sha256Hex, verifyAuditChain } from "@/lib/audit";
import { doc, p } from "@/lib/documents/rich-text";
import { proposalSchema } from "@/lib/schemas/change";
import { particleSampleSchema } from "@/lib/schemas/evidence";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { loadChangeState } from "@/lib/server/changes/state";
import { approveVersion } from "@/lib/server/documents/approve-version";
import { createDocument } from "@/lib/server/documents/create-document";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { signReview } from "@/lib/server/documents/sign-review";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { UserFacingError } from "@/lib/server/errors";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { signRun } from "@/lib/server/evidence/sign-run";
import { createUser } from "@/lib/server/users/create-user";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";
import { todayUtc } from "@/lib/format/date";

/**
 * Two people acting on one record at the same moment, on a real database file:
 * exactly one of them wins, the other is told why nothing happened, and the
 * audit trail holds the winner's event alone.
 */
let t: Awaited<ReturnType<typeof createTestDatabase>>;
type Person = { id: string; name: string; roles: Role[]; password: string; email: string };
const people: Record<
  "engineer" | "engineer2" | "reviewer" | "reviewer2" | "approver" | "technician",
  Person
> = {} as never;
const NOW = new Date();
const hashOf = (content: unknown) => sha256Hex(canonicalJson(content));

async function demoPerson(key: keyof typeof people, role: Role) {
  const [u] = await t.db
    .select()
    .from(users)
    .where(eq(users.email, `${role}@fennmoor.example`));
  people[key] = { id: u.id, name: u.name, roles: [role], password: DEMO_PASSWORD, email: u.email };
}
async function newPerson(key: keyof typeof people, name: string, role: Role) {
  const email = `${key}@concurrency.test`;
  const { id, temporaryPassword } = await createUser(
    { id: null, name: "setup" },
    { name, email, jobTitle: null, roles: [role] },
  );
  people[key] = { id, name, roles: [role], password: temporaryPassword, email };
}

const eventsOn = (recordId: string, action: string) =>
  t.db
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.recordId, recordId), eq(auditEvents.action, action)));

/** Both settle; the one that failed must have failed for a reason the user is shown. */
async function race<A, B>(a: Promise<A>, b: Promise<B>) {
  const [ra, rb] = await Promise.allSettled([a, b]);
  const won = [ra, rb].filter((r) => r.status === "fulfilled");
  const lost = [ra, rb].filter((r): r is PromiseRejectedResult => r.status === "rejected");
  return { won, lost, firstWon: ra.status === "fulfilled" };
}

async function documentInReview(reviewerIds: string[], routing: "sequence" | "parallel") {
  const { versionId } = await createDocument(people.engineer, {
    type: "pq_protocol",
    title: "PQ under two signers",
    systemId: null,
    partFamilyId: null,
    recipeVersionId: null,
    confidencePct: 95,
    reliabilityPct: 90,
  });
  const content = doc(p("Valve bodies washed at 60 °C."));
  await saveDraft(people.engineer, { versionId, lockVersion: 0, content, overwrite: false });
  await submitForReview(people.engineer, {
    versionId,
    lockVersion: 1,
    contentHash: hashOf(content),
    reviewerIds,
    approverId: people.approver.id,
    routing,
    dueDate: null,
    password: people.engineer.password,
  });
  return { versionId, contentHash: hashOf(content) };
}

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  await demoPerson("engineer", "engineer");
  await demoPerson("reviewer", "reviewer");
  await demoPerson("approver", "approver");
  await demoPerson("technician", "technician");
  await newPerson("engineer2", "Oskar Lindqvist", "engineer");
  await newPerson("reviewer2", "Wren Halloway", "reviewer");
});
afterAll(() => t.cleanup());

describe("concurrent signers", () => {
  it("the same approval sent twice at once signs once; the second is told the version no longer waits for it", async () => {
    const { versionId, contentHash } = await documentInReview([people.reviewer.id], "sequence");
    await signReview(people.reviewer, {
      versionId,
      contentHash,
      password: people.reviewer.password,
    });
    const approve = () =>
      approveVersion(people.approver, {
        versionId,
        contentHash,
        password: people.approver.password,
        effectiveDate: todayUtc(NOW),
      });
    const { won, lost } = await race(approve(), approve());
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    expect(lost[0].reason).toBeInstanceOf(UserFacingError);
    expect(lost[0].reason.message).toMatch(/cannot|not waiting/i);
    const approvals = await t.db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordId, versionId), eq(signatures.meaning, "approved")));
    expect(approvals).toHaveLength(1);
    expect(await eventsOn(versionId, "document.approved")).toHaveLength(1);
    expect(
      (await t.db.select().from(documentVersions).where(eq(documentVersions.id, versionId)))[0]
        .status,
    ).toBe("effective");
  });

  it("two reviewers in parallel both sign, and the approver's step opens exactly once", async () => {
    const { versionId, contentHash } = await documentInReview(
      [people.reviewer.id, people.reviewer2.id],
      "parallel",
    );
    const before = (
      await t.db.select().from(emailOutbox).where(eq(emailOutbox.to, people.approver.email))
    ).length;
    const { won } = await race(
      signReview(people.reviewer, { versionId, contentHash, password: people.reviewer.password }),
      signReview(people.reviewer2, { versionId, contentHash, password: people.reviewer2.password }),
    );
    expect(won).toHaveLength(2);
    expect(await eventsOn(versionId, "document.reviewed")).toHaveLength(2);
    // Neither signer may miss the other's decision, or nobody would open the approval step.
    expect(
      (await t.db.select().from(emailOutbox).where(eq(emailOutbox.to, people.approver.email)))
        .length,
    ).toBe(before + 1);
  });

  it("two people verifying one performed run at once: one verification, the other refused with the run's state", async () => {
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-VB-210"));
    // The valve body's effective recipe, the one it is qualified on (runs are refused elsewhere).
    const [{ version }] = await t.db
      .select({ version: recipeVersions })
      .from(requalificationIntervals)
      .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
      .where(
        and(
          eq(requalificationIntervals.partFamilyId, family.id),
          eq(recipeVersions.status, "effective"),
        ),
      );
    const run = await createRun(people.engineer, {
      partFamilyId: family.id,
      recipeVersionId: version.id,
      testType: "particle_cleanliness",
      technicianId: people.technician.id,
      lab: "Larchfield lab",
      performedOn: "2026-03-02",
    });
    await addSample(people.technician, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "P-1",
        components: "1",
        counts: { E: "4" },
        largest: {},
      }),
    });
    const hash = async () => (await runContent(t.db, (await getRunRow(t.db, run.id))!)).hash;
    await signRun({
      userId: people.technician.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning: "performed",
      contentHash: await hash(),
    });
    const contentHash = await hash();
    const { won, lost } = await race(
      signRun({
        userId: people.reviewer.id,
        password: people.reviewer.password,
        runId: run.id,
        meaning: "verified",
        contentHash,
      }),
      signRun({
        userId: people.approver.id,
        password: people.approver.password,
        runId: run.id,
        meaning: "verified",
        contentHash,
      }),
    );
    expect(won).toHaveLength(1);
    expect(lost[0].reason).toBeInstanceOf(UserFacingError);
    expect(lost[0].reason.message).toBe(
      "This run is verified; only a performed run can be verified.",
    );
    expect(
      await t.db
        .select()
        .from(signatures)
        .where(and(eq(signatures.recordId, run.id), eq(signatures.meaning, "verified"))),
    ).toHaveLength(1);
    expect(await eventsOn(run.id, "test_run.verified")).toHaveLength(1);
  });
});

describe("concurrent editors", () => {
  it("two saves of one draft from the same reading: one is kept, the other is returned as a conflict and not written", async () => {
    const { versionId } = await createDocument(people.engineer, {
      type: "oq_protocol",
      title: "OQ edited twice",
      systemId: null,
      partFamilyId: null,
      recipeVersionId: null,
      confidencePct: 95,
      reliabilityPct: 90,
    });
    const mine = doc(p("Rinse conductivity below 30 µS/cm."));
    const theirs = doc(p("Rinse conductivity below 20 µS/cm."));
    const [a, b] = await Promise.all([
      saveDraft(people.engineer, { versionId, lockVersion: 0, content: mine, overwrite: false }),
      saveDraft(people.engineer2, { versionId, lockVersion: 0, content: theirs, overwrite: false }),
    ]);
    const results = [a, b];
    expect(results.filter((r) => r.ok)).toHaveLength(1);
    const conflict = results.find((r) => !r.ok);
    expect(conflict).toMatchObject({
      ok: false,
      conflict: true,
      currentLockVersion: 1,
      message: expect.stringMatching(/Someone saved this draft after you opened it/),
    });
    const [row] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, versionId));
    expect(row.lockVersion).toBe(1);
    expect(row.content).toEqual(a.ok ? mine : theirs);
    const edits = await eventsOn(versionId, "document.edited");
    expect(edits).toHaveLength(1);
    expect(edits[0].actorId).toBe(a.ok ? people.engineer.id : people.engineer2.id);
  });

  it("two saves of one change proposal from the same reading: one is kept, the other is refused with a clear message", async () => {
    const [recipe] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    const cr = await openChangeRequest(people.engineer, {
      recipeId: recipe.id,
      title: "Two engineers, one proposal",
      kind: "parameter_change",
    });
    const s = await loadChangeState(t.db, cr.id);
    const proposal = (setpoint: string) =>
      proposalSchema.parse(
        proposalForm(s, (q) => q.key === "wash.temperature" && (q.setpoint = setpoint)),
      );
    const { won, lost, firstWon } = await race(
      saveProposal(people.engineer, proposal("62")),
      saveProposal(people.engineer2, proposal("57")),
    );
    expect(won).toHaveLength(1);
    expect(lost[0].reason).toBeInstanceOf(UserFacingError);
    expect(lost[0].reason.message).toMatch(
      /^Someone saved this proposal after you opened it\. Nothing was saved/,
    );
    const after = await loadChangeState(t.db, cr.id);
    const washTemperature = after.to.stages
      .flatMap((st) => st.parameters)
      .find((q) => q.key === "wash.temperature")!;
    expect(washTemperature.setpoint).toBe(firstWon ? 62 : 57);
    expect(
      (
        await t.db
          .select()
          .from(changeRequestAssessments)
          .where(eq(changeRequestAssessments.changeRequestId, cr.id))
      )[0].lockVersion,
    ).toBe(1);
    const saves = await eventsOn(cr.id, "change.proposal_saved");
    expect(saves).toHaveLength(1);
    expect(saves[0].actorId).toBe(firstWon ? people.engineer.id : people.engineer2.id);
  });

  it("leaves an unbroken audit chain after all of it", async () => {
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true });
  });
});
