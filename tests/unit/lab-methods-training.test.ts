import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  emailOutbox,
  labMethods,
  signatures,
  testRunMethods,
  testRuns,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { labMethodSchema } from "@/lib/schemas/lab-method";
import { citeMethods } from "@/lib/server/evidence/cite-methods";
import { runContent } from "@/lib/server/evidence/run-content";
import { describeFailure } from "@/lib/server/errors";
import { approveMethodIn } from "@/lib/server/lab-methods/approve-method-in";
import { draftMethod } from "@/lib/server/lab-methods/draft-method";
import { loadMethod } from "@/lib/server/lab-methods/state";
import { trainingQueueProvider } from "@/lib/server/training/queue-provider";
import { sendTrainingReminders } from "@/lib/server/training/send-training-reminders";
import { signOffTrainingIn } from "@/lib/server/training/sign-off-training-in";
import { acknowledgeProcedureIn } from "@/lib/server/training/acknowledge-procedure-in";
import { loadTrainingMatrix, proceduresToAcknowledge } from "@/lib/server/training/queries";
import { todayUtc } from "@/lib/format/date";
import { trainingProblemsForRun } from "@/lib/server/training/state";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string; email: string }> = {};
const NOW = new Date("2026-12-03T10:00:00.000Z");
let openRun = "";

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "technician", "admin"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name, email: u.email };
  }
  const [run] = await t.db
    .select({ id: testRuns.id })
    .from(testRuns)
    .where(and(eq(testRuns.status, "open"), eq(testRuns.testType, "particle_cleanliness")));
  openRun = run.id;
}, 120_000);
afterAll(() => t.cleanup());

async function refusal(promise: Promise<unknown>) {
  try {
    await promise;
  } catch (error) {
    return describeFailure(error);
  }
  throw new Error("expected a refusal");
}

const byCode = async (code: string, version: number) =>
  (
    await t.db
      .select()
      .from(labMethods)
      .where(and(eq(labMethods.code, code), eq(labMethods.version, version)))
  )[0];

describe("the demo's methods", () => {
  it("are approved, and the verified lab-report run's signatures bind to content citing them", async () => {
    const [ex, an, gr] = await Promise.all([
      byCode("EX-01", 1),
      byCode("AN-01", 1),
      byCode("GR-01", 1),
    ]);
    expect([ex.status, an.status, gr.status]).toEqual(["approved", "approved", "approved"]);
    expect(ex.qualificationRunId).not.toBeNull();
    const cited = await t.db
      .select({ runId: testRunMethods.runId })
      .from(testRunMethods)
      .innerJoin(testRuns, eq(testRuns.id, testRunMethods.runId))
      .where(and(eq(testRunMethods.methodId, an.id), eq(testRuns.status, "verified")));
    expect(cited).toHaveLength(1);
    const [run] = await t.db.select().from(testRuns).where(eq(testRuns.id, cited[0].runId));
    const { hash, content } = await runContent(t.db, run);
    expect(content.methods).toEqual([
      { kind: "analysis", methodId: an.id, code: "AN-01", version: 1 },
      { kind: "extraction", methodId: ex.id, code: "EX-01", version: 1 },
    ]);
    const sigs = await t.db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordType, "test_run"), eq(signatures.recordId, run.id)));
    expect(sigs.map((s) => s.contentHash)).toEqual([hash, hash]);
  });
});

describe("versioning and approval", () => {
  const v2 = () =>
    labMethodSchema.parse({
      kind: "analysis",
      code: "AN-01",
      name: "Membrane analysis, automated light microscope",
      trainingIntervalMonths: "24",
      details: {
        filterMaterial: "PET mesh",
        poreSizeUm: "5",
        system: "light_microscope_automated",
        magnification: "100",
        lowerSizeLimitUm: "15",
        distinguishes: ["reflective", "non_reflective", "fibre"],
      },
    });
  let draftId = "";

  it("drafts the next version of a code, one draft at a time, and audits it", async () => {
    const { id, version } = await draftMethod(people.engineer, v2());
    draftId = id;
    expect(version).toBe(2);
    const again = await refusal(draftMethod(people.engineer, v2()));
    expect(again.fieldErrors).toHaveProperty("code");
    expect(again.message).toMatch(/AN-01 v2 is still a draft/);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordId, id), eq(auditEvents.action, "lab_method.drafted")));
    expect(event.actorId).toBe(people.engineer.id);
  });

  it("refuses a draft cited by a run, naming the field", async () => {
    const failure = await refusal(
      citeMethods(people.technician, {
        runId: openRun,
        extraction: null,
        analysis: draftId,
        gravimetric: null,
      }),
    );
    expect(failure.fieldErrors).toHaveProperty("analysis");
    expect(failure.message).toMatch(/a draft, not yet approved/);
  });

  it("refuses the drafter's own approval and a stale hash", async () => {
    const view = await loadMethod(t.db, draftId);
    const own = await refusal(
      t.db.transaction((tx) =>
        approveMethodIn(tx, people.engineer, { methodId: draftId, contentHash: view.contentHash }),
      ),
    );
    expect(own.kind).toBe("forbidden");
    const stale = await refusal(
      t.db.transaction((tx) =>
        approveMethodIn(tx, people.approver, { methodId: draftId, contentHash: "0".repeat(64) }),
      ),
    );
    expect(stale.message).toMatch(/changed since you opened it/);
  });

  it("approves with a signature bound to the content and supersedes the version before", async () => {
    const view = await loadMethod(t.db, draftId);
    await t.db.transaction((tx) =>
      approveMethodIn(tx, people.approver, { methodId: draftId, contentHash: view.contentHash }),
    );
    expect((await byCode("AN-01", 2)).status).toBe("approved");
    const v1 = await byCode("AN-01", 1);
    expect(v1.status).toBe("superseded");
    const [sig] = await t.db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordType, "lab_method"), eq(signatures.recordId, draftId)));
    expect(sig).toMatchObject({ meaning: "approved", contentHash: view.contentHash });
    const events = await t.db
      .select({ action: auditEvents.action, recordId: auditEvents.recordId })
      .from(auditEvents)
      .where(eq(auditEvents.recordType, "lab_method"));
    expect(events).toContainEqual({ action: "lab_method.approved", recordId: draftId });
    expect(events).toContainEqual({ action: "lab_method.superseded", recordId: v1.id });

    // The superseded version is no longer citable; the kind must fit the test type.
    const superseded = await refusal(
      citeMethods(people.technician, {
        runId: openRun,
        extraction: null,
        analysis: v1.id,
        gravimetric: null,
      }),
    );
    expect(superseded.fieldErrors).toHaveProperty("analysis");
    const gr = await byCode("GR-01", 1);
    const wrongKind = await refusal(
      citeMethods(people.technician, {
        runId: openRun,
        extraction: null,
        analysis: null,
        gravimetric: gr.id,
      }),
    );
    expect(wrongKind.fieldErrors).toHaveProperty("gravimetric");
  });

  it("cites the approved version, changing the run's content hash, audited", async () => {
    const [run] = await t.db.select().from(testRuns).where(eq(testRuns.id, openRun));
    const before = (await runContent(t.db, run)).hash;
    const ex = await byCode("EX-01", 1);
    await citeMethods(people.technician, {
      runId: openRun,
      extraction: ex.id,
      analysis: draftId,
      gravimetric: null,
    });
    expect((await runContent(t.db, run)).hash).not.toBe(before);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, openRun), eq(auditEvents.action, "test_run.methods_cited")),
      )
      .orderBy(auditEvents.seq);
    expect(event).toBeDefined();
  });
});

describe("training gate and sign-offs", () => {
  it("passes the demo technician today and names the lapse on the expiry day", async () => {
    expect(await trainingProblemsForRun(t.db, openRun, people.technician.id, "2026-12-03")).toEqual(
      [],
    );
    // The engineer was signed off on 2026-01-15 for 24 months [derived: lapses 2028-01-15].
    const problems = await trainingProblemsForRun(t.db, openRun, people.engineer.id, "2028-01-15");
    expect(problems.join(" ")).toMatch(/EX-01 v1 .* lapsed on 2028-01-15/);
    expect(await trainingProblemsForRun(t.db, openRun, people.engineer.id, "2028-01-14")).toEqual(
      [],
    );
  });

  it("lets a currently trained technician train others on that method, not on one they have lapsed on", async () => {
    const ok = await t.db.transaction((tx) =>
      signOffTrainingIn(
        tx,
        people.technician,
        { userId: people.engineer.id, methodCode: "EX-01", trainedOn: "2026-12-01" },
        NOW,
      ),
    );
    expect(ok.expiresOn).toBe("2028-12-01");
    const lapsed = await refusal(
      t.db.transaction((tx) =>
        signOffTrainingIn(
          tx,
          people.technician,
          { userId: people.engineer.id, methodCode: "GR-01", trainedOn: "2026-12-01" },
          NOW,
        ),
      ),
    );
    expect(lapsed.kind).toBe("forbidden");
    const own = await refusal(
      t.db.transaction((tx) =>
        signOffTrainingIn(
          tx,
          people.approver,
          { userId: people.approver.id, methodCode: "GR-01", trainedOn: "2026-12-01" },
          NOW,
        ),
      ),
    );
    expect(own.fieldErrors).toHaveProperty("userId");
    const future = await refusal(
      t.db.transaction((tx) =>
        signOffTrainingIn(
          tx,
          people.approver,
          { userId: people.technician.id, methodCode: "GR-01", trainedOn: "2026-12-04" },
          NOW,
        ),
      ),
    );
    expect(future.fieldErrors).toHaveProperty("trainedOn");
  });

  it("reminds the technician of the lapsed weighing training once, in My queue and by e-mail", async () => {
    const queue = await trainingQueueProvider(
      { id: people.technician.id, roles: ["technician"] } as never,
      NOW,
    );
    expect(queue.items.map((i) => i.title)).toEqual([
      "Lapsed: your training on GR-01 Residue weighing on 5 µm membranes",
    ]);
    expect((await sendTrainingReminders(NOW)).sent).toBe(1);
    expect((await sendTrainingReminders(NOW)).sent).toBe(0);
    const mail = await t.db
      .select()
      .from(emailOutbox)
      .where(eq(emailOutbox.to, people.technician.email));
    expect(mail.map((m) => m.subject).join("\n")).toContain(
      "Training lapsed: GR-01 Residue weighing on 5 µm membranes",
    );
  });

  it("after the approver's sign-off the retraining clears the queue item", async () => {
    await t.db.transaction((tx) =>
      signOffTrainingIn(
        tx,
        people.approver,
        { userId: people.technician.id, methodCode: "GR-01", trainedOn: "2026-12-03" },
        NOW,
      ),
    );
    const queue = await trainingQueueProvider(
      { id: people.technician.id, roles: ["technician"] } as never,
      NOW,
    );
    expect(queue.items).toEqual([]);
  });
});

describe("the training matrix", () => {
  it("shows a procedure as a column once someone has acknowledged it, not every procedure in the library", async () => {
    // A procedure in force that nobody has read yet.
    await t.client.execute(`
      insert into documents (id, number, title, type, owner_id, created_at)
      values ('matrix-sop', 'SOP-MX-01', 'Filter housing change', 'procedure', '${people.engineer.id}', '2026-11-01T00:00:00.000Z')`);
    await t.client.execute(`
      insert into document_versions (id, document_id, version, status, content, effective_date, created_by, created_at)
      select 'matrix-sop-v1', 'matrix-sop', 1, 'effective', content, '2026-11-02', created_by, created_at
      from document_versions limit 1`);
    const today = todayUtc(NOW);
    const before = await loadTrainingMatrix(today);
    const columnsOf = (m: typeof before) =>
      m.columns.filter((c) => c.kind === "procedure").map((c) => c.subjectId);
    expect(columnsOf(before)).not.toContain("matrix-sop-v1");
    const { procedures: unread } = await proceduresToAcknowledge(people.engineer.id, today);
    const next = unread.find((p) => p.versionId === "matrix-sop-v1")!;
    expect(next).toBeDefined();
    await t.db.transaction((tx) =>
      acknowledgeProcedureIn(tx, people.engineer, { documentVersionId: next.versionId }, NOW),
    );
    const after = await loadTrainingMatrix(today);
    expect(columnsOf(after)).toEqual(
      expect.arrayContaining([...columnsOf(before), next.versionId]),
    );
    expect(columnsOf(after)).toHaveLength(columnsOf(before).length + 1);
    const column = after.columns.findIndex((c) => c.subjectId === next.versionId);
    const row = after.rows.find((r) => r.person.id === people.engineer.id)!;
    expect(row.cells[column].state).toBe("current");
  });

  it("offers each person the procedures they have still to acknowledge, searchable, fifty at a time", async () => {
    // 60 more procedures in force, SOP-BULK-01 to SOP-BULK-60.
    await t.client.execute(`
      insert into documents (id, number, title, type, owner_id, created_at)
      select 'bulk-' || n, 'SOP-BULK-' || printf('%02d', n), 'Bulk procedure ' || n || ': drain to 40% fill_level', 'procedure', '${people.engineer.id}', '2026-11-01T00:00:00.000Z'
      from (with recursive s(n) as (select 1 union all select n + 1 from s where n < 60) select n from s)`);
    await t.client.execute(`
      insert into document_versions (id, document_id, version, status, content, effective_date, created_by, created_at)
      select 'bulk-' || n || '-v1', 'bulk-' || n, 1, 'effective', (select content from document_versions limit 1), '2026-11-02', '${people.engineer.id}', '2026-11-01T00:00:00.000Z'
      from (with recursive s(n) as (select 1 union all select n + 1 from s where n < 60) select n from s)`);
    const today = todayUtc(NOW);
    const engineer = await proceduresToAcknowledge(people.engineer.id, today);
    expect(engineer.total).toBeGreaterThanOrEqual(60);
    expect(engineer.procedures).toHaveLength(50);
    const numbers = engineer.procedures.map((p) => p.number);
    expect(numbers).toEqual([...numbers].sort());
    // The procedure the engineer acknowledged above is current, so it is not offered again.
    expect(engineer.procedures.map((p) => p.versionId)).not.toContain("matrix-sop-v1");
    const technician = await proceduresToAcknowledge(people.technician.id, today, "sop-mx");
    expect(technician.procedures.map((p) => p.versionId)).toEqual(["matrix-sop-v1"]);

    const found = await proceduresToAcknowledge(people.engineer.id, today, "BULK-5 procedure");
    expect(found.procedures.map((p) => p.number)).toEqual(
      Array.from({ length: 10 }, (_, i) => `SOP-BULK-5${i}`),
    );
    // `%` and `_` in the search match themselves, not any text.
    expect((await proceduresToAcknowledge(people.engineer.id, today, "fill_level")).total).toBe(60);
    expect((await proceduresToAcknowledge(people.engineer.id, today, "%fill")).total).toBe(0);
    expect((await proceduresToAcknowledge(people.engineer.id, today, "drain_to")).total).toBe(0);
  });
});
