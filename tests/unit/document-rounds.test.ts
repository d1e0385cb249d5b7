import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { documentReviews, documentVersions, type Role } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { doc, p, plainText } from "@/lib/documents/rich-text";
import { redline } from "@/lib/documents/redline";
import { lastReturn, previousRouting } from "@/lib/documents/rounds";
import { createDocument } from "@/lib/server/documents/create-document";
import { getRoundText, getVersion } from "@/lib/server/documents/queries";
import { returnToAuthor } from "@/lib/server/documents/return-to-author";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { createUser } from "@/lib/server/users/create-user";
import { buildTemplate, type TemplateContext } from "@/templates/documents";
import { createTestDatabase } from "./support/test-db";

// The second review round: what changed since the reviewer sent it back, their comment,
// and a resubmission that starts from the reviewers (and their order) of the last round.

let t: Awaited<ReturnType<typeof createTestDatabase>>;
type Person = { id: string; name: string; roles: Role[]; password: string };
const people: Record<"author" | "first" | "second" | "approver", Person> = {} as never;
const NOW = new Date("2026-05-04T08:00:00.000Z");

async function person(key: keyof typeof people, name: string, roles: Role[]) {
  const { id, temporaryPassword } = await createUser(
    { id: null, name: "setup" },
    { name, email: `${key}@example.test`, jobTitle: null, roles },
  );
  people[key] = { id, name, roles, password: temporaryPassword };
}

async function submit(versionId: string, reviewerIds: string[]) {
  const [v] = await t.db.select().from(documentVersions).where(eq(documentVersions.id, versionId));
  return submitForReview(
    people.author,
    {
      versionId,
      lockVersion: v.lockVersion,
      contentHash: sha256Hex(canonicalJson(v.content)),
      reviewerIds,
      approverId: people.approver.id,
      routing: "sequence",
      dueDate: null,
      password: people.author.password,
    },
    NOW,
  );
}

beforeAll(async () => {
  t = await createTestDatabase();
  await person("author", "Ada Author", ["engineer"]);
  await person("first", "Zed First", ["reviewer"]);
  await person("second", "Abe Second", ["reviewer"]);
  await person("approver", "Abel Approver", ["approver"]);
});
afterAll(() => t.cleanup());

describe("a document's second review round", () => {
  it("keeps each round's submitted text, so the reviewer sees what changed since sending it back", async () => {
    const { versionId } = await createDocument(people.author, {
      type: "procedure",
      title: "Loading the valve-body basket",
      systemId: null,
      partFamilyId: null,
      recipeVersionId: null,
      confidencePct: 95,
      reliabilityPct: 90,
    });
    const [v0] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, versionId));
    await saveDraft(people.author, {
      versionId,
      lockVersion: v0.lockVersion,
      content: doc(p("Load ten parts per layer.")),
      overwrite: false,
    });
    // Reviewers chosen in an order that is not alphabetical: Zed signs before Abe.
    await submit(versionId, [people.first.id, people.second.id]);
    await returnToAuthor(
      people.first,
      { versionId, comment: "Say which layer is the worst case.", decision: "sent_back" },
      NOW,
    );
    const [v1] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, versionId));
    await saveDraft(people.author, {
      versionId,
      lockVersion: v1.lockVersion,
      content: doc(p("Load ten parts per layer; the lowest layer is the worst case.")),
      overwrite: false,
    });

    const draft = await getVersion(v1.documentId, 1);
    expect(lastReturn(draft!.reviews)).toMatchObject({
      round: 1,
      by: "Zed First",
      comment: "Say which layer is the worst case.",
      decision: "sent_back",
    });
    expect(previousRouting(draft!.reviews, draft!.routing)).toEqual({
      reviewerIds: [people.first.id, people.second.id],
      approverId: people.approver.id,
      routing: "sequence",
    });

    await submit(versionId, [people.first.id, people.second.id]);
    const returned = await getRoundText(versionId, 1);
    expect(plainText(returned!)).toContain("Load ten parts per layer.");
    const current = await getVersion(v1.documentId, 1);
    const diff = redline(returned!, current!.content);
    expect(
      diff.segments
        .filter((s) => s.kind === "inserted")
        .map((s) => s.text)
        .join(""),
    ).toMatch(/lowest layer is the worst case/);
    expect(await getRoundText(versionId, 2)).toEqual(current!.content);
    // Round 2 routes in the order chosen, Zed first.
    const steps = await t.db
      .select()
      .from(documentReviews)
      .where(eq(documentReviews.versionId, versionId));
    const round2 = steps.filter((s) => s.round === 2 && s.role === "reviewer");
    expect(round2.sort((a, b) => a.step - b.step).map((s) => s.assigneeId)).toEqual([
      people.first.id,
      people.second.id,
    ]);
  });

  it("a version never returned has no comment and no earlier routing", () => {
    expect(lastReturn([])).toBeNull();
    expect(previousRouting([], null)).toBeNull();
  });
});

describe("the validation-report template", () => {
  const ctx: TemplateContext = {
    type: "report",
    number: "VR-AW3-0002",
    title: "PQ report, valve bodies",
    system: null,
    partFamily: null,
    recipe: null,
    sample: { confidencePct: 95, reliabilityPct: 90, size: 29 },
    runs: [
      {
        number: "TR-0004",
        testType: "particle_cleanliness",
        samples: 29,
        outcome: "pass",
        status: "verified",
        performedOn: "2025-04-08",
        technician: "Ravi Menon",
      },
      {
        number: "TR-0005",
        testType: "gravimetric",
        samples: 12,
        outcome: "incomplete",
        status: "open",
        performedOn: null,
        technician: null,
      },
    ],
  };
  const text = plainText(buildTemplate(ctx));

  it("opens with report wording, not a protocol's instruction", () => {
    expect(text).not.toMatch(/before the first run/);
    expect(text).toMatch(/It records the runs performed, their results/);
  });

  it("fills the results table from the linked runs", () => {
    expect(text).toMatch(/TR-0004 \(verified, 2025-04-08, Ravi Menon\)/);
    expect(text).toMatch(/Particle cleanliness/);
    expect(text).toMatch(/TR-0005 \(open\)/);
    expect(text).toMatch(/Runs performed: TR-0004, TR-0005/);
  });

  it("a protocol still tells its reader to read it before the first run", () => {
    expect(plainText(buildTemplate({ ...ctx, type: "pq_protocol" }))).toMatch(
      /before the first run/,
    );
  });
});

describe("two tabs on one draft", () => {
  it("saving over theirs after they saved again says so, and the next press replaces their newest text", async () => {
    const { versionId } = await createDocument(people.author, {
      type: "procedure",
      title: "Two tabs",
      systemId: null,
      partFamilyId: null,
      recipeVersionId: null,
      confidencePct: 95,
      reliabilityPct: 90,
    });
    const save = (lockVersion: number, text: string, overwrite = false, at = NOW) =>
      saveDraft(people.author, { versionId, lockVersion, content: doc(p(text)), overwrite }, at);
    expect(await save(0, "Tab A, first")).toMatchObject({ ok: true, lockVersion: 1 });
    const conflict = await save(0, "Tab B");
    expect(conflict).toMatchObject({ ok: false, currentLockVersion: 1 });
    // Tab A saves again while tab B's author decides.
    await save(1, "Tab A, again", false, new Date("2026-05-04T08:05:07.000Z"));
    const overStale = await save(1, "Tab B", true);
    expect(overStale).toMatchObject({ ok: false, currentLockVersion: 2 });
    if (overStale.ok) throw new Error("saved over a text the author had not been told about");
    expect(overStale.message).toBe(
      "They saved again at 08:05:07 UTC, after the text you chose to replace. Nothing was saved: press “Save my text over theirs” again to replace their newest text, or load theirs.",
    );
    expect(await save(overStale.currentLockVersion, "Tab B", true)).toMatchObject({
      ok: true,
      lockVersion: 3,
    });
    const [row] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, versionId));
    expect(row.content).toEqual(doc(p("Tab B")));
  });
});
