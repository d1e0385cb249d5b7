import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { documentReviews, documentVersions, emailOutbox, users, type Role } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { doc, h, p } from "@/lib/documents/rich-text";
import { approveVersion } from "@/lib/server/documents/approve-version";
import { createDocument } from "@/lib/server/documents/create-document";
import { notifyOverdueReviews } from "@/lib/server/documents/notify-overdue-reviews";
import { documentQueueProvider } from "@/lib/server/documents/queue-provider";
import { returnToAuthor } from "@/lib/server/documents/return-to-author";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { activateNextStep, loadVersion } from "@/lib/server/documents/shared";
import { signReview } from "@/lib/server/documents/sign-review";
import { startNewVersion } from "@/lib/server/documents/start-new-version";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { listSignatures } from "@/lib/server/signatures/queries";
import { createUser } from "@/lib/server/users/create-user";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
type Person = { id: string; name: string; roles: Role[]; password: string; email: string };
const people: Record<"author" | "reviewer" | "reviewer2" | "approver" | "authorApprover", Person> =
  {} as never;

async function person(key: keyof typeof people, name: string, roles: Role[]) {
  const email = `${key.toLowerCase()}@example.test`;
  const { id, temporaryPassword } = await createUser(
    { id: null, name: "setup" },
    { name, email, jobTitle: null, roles },
  );
  people[key] = { id, name, roles, password: temporaryPassword, email };
}

const NOW = new Date("2026-05-04T08:00:00.000Z");
const hashOf = (content: unknown) => sha256Hex(canonicalJson(content));

async function newDraft(title = "PQ of the valve-body recipe") {
  return createDocument(people.author, {
    type: "pq_protocol",
    title,
    systemId: null,
    partFamilyId: null,
    recipeVersionId: null,
    confidencePct: 95,
    reliabilityPct: 90,
  });
}

async function versionRow(versionId: string) {
  const [row] = await t.db
    .select()
    .from(documentVersions)
    .where(eq(documentVersions.id, versionId));
  return row;
}

async function outboxTo(email: string) {
  return t.db.select().from(emailOutbox).where(eq(emailOutbox.to, email));
}

async function submit(
  versionId: string,
  opts: Partial<Parameters<typeof submitForReview>[1]> = {},
) {
  const v = await versionRow(versionId);
  return submitForReview(
    people.author,
    {
      versionId,
      lockVersion: v.lockVersion,
      contentHash: hashOf(v.content),
      reviewerIds: [people.reviewer.id],
      approverId: people.approver.id,
      routing: "sequence",
      dueDate: null,
      password: people.author.password,
      ...opts,
    },
    NOW,
  );
}

beforeAll(async () => {
  t = await createTestDatabase();
  await person("author", "Ada Author", ["engineer"]);
  await person("reviewer", "Rui Reviewer", ["reviewer"]);
  await person("reviewer2", "Rena Reviewer", ["reviewer"]);
  await person("approver", "Abel Approver", ["approver"]);
  await person("authorApprover", "Dana Both", ["engineer", "approver"]);
});
afterAll(() => t.cleanup());

describe("creating from a template", () => {
  it("numbers the document and writes the sample size from the success-run theorem", async () => {
    const a = await newDraft();
    const b = await newDraft("Second PQ");
    expect(a.number).toBe("PQ-GEN-0001");
    expect(b.number).toBe("PQ-GEN-0002");
    const v = await versionRow(a.versionId);
    // [derived] success run, C 95 % / R 90 % → 29 (reference §4)
    expect(JSON.stringify(v.content)).toContain("n = 29 parts");
    expect(v.status).toBe("draft");
  });
});

describe("optimistic concurrency on drafts", () => {
  it("refuses a stale save with the current counter and keeps the other person's text", async () => {
    const { versionId } = await newDraft();
    const first = await saveDraft(people.author, {
      versionId,
      lockVersion: 0,
      content: doc(p("Mine, saved first.")),
      overwrite: false,
    });
    expect(first).toMatchObject({ ok: true, lockVersion: 1 });
    const stale = await saveDraft(people.author, {
      versionId,
      lockVersion: 0,
      content: doc(p("Theirs, from an old tab.")),
      overwrite: false,
    });
    expect(stale).toMatchObject({ ok: false, conflict: true, currentLockVersion: 1 });
    expect((await versionRow(versionId)).content).toEqual(doc(p("Mine, saved first.")));
    const deliberate = await saveDraft(people.author, {
      versionId,
      lockVersion: 1,
      content: doc(p("Theirs, on purpose.")),
      overwrite: true,
    });
    expect(deliberate).toMatchObject({ ok: true, lockVersion: 2 });
  });

  it("refuses editing by a role that may not draft", async () => {
    const { versionId } = await newDraft();
    await expect(
      saveDraft(people.reviewer, {
        versionId,
        lockVersion: 0,
        content: doc(p("x")),
        overwrite: false,
      }),
    ).rejects.toThrow(/role does not allow/);
  });
});

describe("routing, signatures and lifecycle", () => {
  it("draft → in review → approved → effective, each signature bound to the frozen hash", async () => {
    const { versionId, documentId } = await newDraft();
    await saveDraft(people.author, {
      versionId,
      lockVersion: 0,
      content: doc(h(2, "Scope"), p("Valve bodies at 60 °C ± 2 °C.")),
      overwrite: false,
    });
    await submit(versionId, { reviewerIds: [people.reviewer.id, people.reviewer2.id] });
    let v = await versionRow(versionId);
    expect(v.status).toBe("in_review");
    expect(v.contentHash).toBe(hashOf(doc(h(2, "Scope"), p("Valve bodies at 60 °C ± 2 °C."))));
    // In sequence: only the first reviewer is asked now.
    expect(await outboxTo(people.reviewer.email)).toHaveLength(1);
    expect(await outboxTo(people.reviewer2.email)).toHaveLength(0);
    expect((await outboxTo(people.reviewer.email))[0].subject).toMatch(/Review requested: PQ-GEN-/);

    await expect(
      signReview(
        people.reviewer2,
        { versionId, contentHash: v.contentHash!, password: people.reviewer2.password },
        NOW,
      ),
    ).rejects.toThrow(/not waiting for your review/);
    await expect(
      signReview(
        people.reviewer,
        { versionId, contentHash: "0".repeat(64), password: people.reviewer.password },
        NOW,
      ),
    ).rejects.toThrow(/changed since you opened it/);
    await signReview(
      people.reviewer,
      { versionId, contentHash: v.contentHash!, password: people.reviewer.password },
      NOW,
    );
    expect(await outboxTo(people.reviewer2.email)).toHaveLength(1);
    await signReview(
      people.reviewer2,
      { versionId, contentHash: v.contentHash!, password: people.reviewer2.password },
      NOW,
    );
    expect((await outboxTo(people.approver.email)).map((m) => m.subject)).toEqual([
      expect.stringMatching(/Approval requested/),
    ]);

    await approveVersion(
      people.approver,
      {
        versionId,
        contentHash: v.contentHash!,
        password: people.approver.password,
        effectiveDate: "2026-05-04",
      },
      NOW,
    );
    v = await versionRow(versionId);
    expect(v.status).toBe("effective");
    expect(v.effectiveDate).toBe("2026-05-04");
    const sigs = await listSignatures("document_version", versionId, v.contentHash);
    expect(sigs.map((s) => [s.meaning, s.printedName, s.validity]).sort()).toEqual([
      ["approved", "Abel Approver", "valid"],
      ["authored", "Ada Author", "valid"],
      ["reviewed", "Rena Reviewer", "valid"],
      ["reviewed", "Rui Reviewer", "valid"],
    ]);
    expect(new Set(sigs.map((s) => s.contentHash))).toEqual(new Set([v.contentHash]));

    // Content that no longer hashes to what was signed shows every signature as invalid (§11.70).
    const tampered = await listSignatures(
      "document_version",
      versionId,
      hashOf(doc(p("Valve bodies at 40 °C."))),
    );
    expect(tampered.every((s) => s.validity === "invalid")).toBe(true);

    // A new version supersedes the effective one once it becomes effective; the old signatures stay with v1.
    await expect(
      startNewVersion(people.reviewer, { documentId, reason: "Raise the temperature" }, NOW),
    ).rejects.toThrow(/role does not allow/);
    const { version } = await startNewVersion(
      people.author,
      { documentId, reason: "Raise the wash temperature to 65 °C" },
      NOW,
    );
    expect(version).toBe(2);
    const [v2] = await t.db
      .select()
      .from(documentVersions)
      .where(and(eq(documentVersions.documentId, documentId), eq(documentVersions.version, 2)));
    await saveDraft(people.author, {
      versionId: v2.id,
      lockVersion: 0,
      content: doc(h(2, "Scope"), p("Valve bodies at 65 °C ± 2 °C.")),
      overwrite: false,
    });
    await submit(v2.id);
    const h2 = (await versionRow(v2.id)).contentHash!;
    await signReview(
      people.reviewer,
      { versionId: v2.id, contentHash: h2, password: people.reviewer.password },
      NOW,
    );
    await approveVersion(
      people.approver,
      {
        versionId: v2.id,
        contentHash: h2,
        password: people.approver.password,
        effectiveDate: "2026-05-04",
      },
      NOW,
    );
    expect((await versionRow(versionId)).status).toBe("superseded");
    expect((await versionRow(v2.id)).status).toBe("effective");
    expect(
      (
        await listSignatures(
          "document_version",
          versionId,
          (await versionRow(versionId)).contentHash,
        )
      ).every((s) => s.validity === "valid"),
    ).toBe(true);
  });

  it("segregation: the author may not be routed as approver, and a wrong password signs nothing", async () => {
    const { versionId } = await createDocument(people.authorApprover, {
      type: "oq_protocol",
      title: "OQ by someone who also approves",
      systemId: null,
      partFamilyId: null,
      recipeVersionId: null,
      confidencePct: 95,
      reliabilityPct: 90,
    });
    const v = await versionRow(versionId);
    const base = {
      versionId,
      lockVersion: v.lockVersion,
      contentHash: hashOf(v.content),
      reviewerIds: [people.reviewer.id],
      routing: "sequence" as const,
      dueDate: null,
    };
    await expect(
      submitForReview(
        people.authorApprover,
        { ...base, approverId: people.authorApprover.id, password: people.authorApprover.password },
        NOW,
      ),
    ).rejects.toThrow(/cannot review or approve their own/);
    await expect(
      submitForReview(
        people.authorApprover,
        { ...base, approverId: people.approver.id, password: "not my password" },
        NOW,
      ),
    ).rejects.toThrow(/password is not correct/);
    const [row] = await t.db.select().from(users).where(eq(users.id, people.authorApprover.id));
    expect(row.failedAttempts).toBe(1);
    expect((await versionRow(versionId)).status).toBe("draft");
  });

  it("send back needs a comment, returns to draft, and identical text cannot be resubmitted", async () => {
    const { versionId } = await newDraft();
    await submit(versionId);
    const frozen = (await versionRow(versionId)).contentHash!;
    await expect(
      returnToAuthor(
        people.approver,
        { versionId, comment: "Not yet my turn", decision: "rejected" },
        NOW,
      ),
    ).rejects.toThrow(/not waiting for your approval/);
    await returnToAuthor(
      people.reviewer,
      { versionId, comment: "Name the worst-case basket position.", decision: "sent_back" },
      NOW,
    );
    const v = await versionRow(versionId);
    expect(v.status).toBe("draft");
    expect(v.contentHash).toBeNull();
    const steps = await t.db
      .select()
      .from(documentReviews)
      .where(eq(documentReviews.versionId, versionId));
    expect(steps.map((s) => s.decision).sort()).toEqual(["sent_back", "withdrawn"]);
    expect((await outboxTo(people.author.email)).at(-1)?.subject).toMatch(/Sent back/);

    const queue = (
      await documentQueueProvider(
        { ...people.author, email: people.author.email, mustChangePassword: false, sessionId: "s" },
        NOW,
      )
    ).items;
    expect(queue.find((i) => i.kind === "Sent back")?.detail).toContain(
      "worst-case basket position",
    );

    await expect(submit(versionId)).rejects.toThrow(/submitted before and returned/);
    await saveDraft(people.author, {
      versionId,
      lockVersion: v.lockVersion,
      content: doc(p("Worst case: centre of the lowest layer.")),
      overwrite: false,
    });
    await submit(versionId);
    const again = await versionRow(versionId);
    expect(again.reviewRound).toBe(2);
    expect(again.contentHash).not.toBe(frozen);
    // The reviewer signs the new content although they reviewed (and returned) the earlier one.
    await signReview(
      people.reviewer,
      { versionId, contentHash: again.contentHash!, password: people.reviewer.password },
      NOW,
    );
  });
});

describe("e-mail in the step's transaction", () => {
  it("a step that rolls back leaves no outbox row; one that commits does", async () => {
    const { versionId } = await newDraft();
    await submit(versionId);
    const before = (await t.db.select().from(emailOutbox)).length;
    await t.db
      .update(documentReviews)
      .set({ activatedAt: null })
      .where(eq(documentReviews.versionId, versionId));
    await expect(
      t.db.transaction(async (tx) => {
        const { version, document } = await loadVersion(tx, versionId);
        expect(await activateNextStep(tx, version, document, "Ada Author", NOW)).toBe("reviewer");
        throw new Error("the step failed after queueing its e-mail");
      }),
    ).rejects.toThrow(/step failed/);
    expect(await t.db.select().from(emailOutbox)).toHaveLength(before);
    await t.db.transaction(async (tx) => {
      const { version, document } = await loadVersion(tx, versionId);
      await activateNextStep(tx, version, document, "Ada Author", NOW);
    });
    expect(await t.db.select().from(emailOutbox)).toHaveLength(before + 1);
  });
});

describe("overdue reviews", () => {
  it("reminds once per open step past its due date and shows it overdue in My queue", async () => {
    const { versionId } = await newDraft("Overdue check");
    await submit(versionId, { dueDate: "2026-05-06" });
    const later = new Date("2026-05-08T09:00:00.000Z");
    const queue = (
      await documentQueueProvider(
        {
          ...people.reviewer,
          email: people.reviewer.email,
          mustChangePassword: false,
          sessionId: "s",
        },
        later,
      )
    ).items;
    const item = queue.find((i) => i.title.includes("Overdue check"));
    expect(item).toMatchObject({ kind: "Review", due: "2026-05-06T23:59:59.999Z" });
    expect(await notifyOverdueReviews(new Date("2026-05-05T09:00:00.000Z"))).toBe(0);
    const sent = await notifyOverdueReviews(later);
    expect(sent).toBeGreaterThanOrEqual(1);
    expect(
      (await outboxTo(people.reviewer.email)).some((m) =>
        m.subject.startsWith("[Washproof] Overdue review: PQ-GEN-"),
      ),
    ).toBe(true);
    expect(await notifyOverdueReviews(later)).toBe(0);
  });
});
