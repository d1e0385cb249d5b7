import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { strFromU8, unzipSync } from "fflate";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { auditEvents, changeRequests, partFamilies, recipes, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD, DEMO_SITE } from "@/db/seed-data";
import { sha256Hex } from "@/lib/audit";
import { proposalSchema } from "@/lib/schemas/change";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { loadChangeState } from "@/lib/server/changes/state";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { computeStoredOutcome } from "@/lib/server/evidence/refresh-outcome";
import { runContent } from "@/lib/server/evidence/run-content";
import { localStore, setStore } from "@/lib/storage";
import { loadAuditPack } from "@/lib/server/trace/audit-pack";
import { exportAuditPack } from "@/lib/server/trace/export-audit-pack";
import { writeCheckpoint } from "@/lib/server/audit/write-checkpoint";
import {
  forgetParameterHistories,
  getParameterHistory,
  listTraceableParameters,
  searchTraceableParameters,
  listTraceScopes,
} from "@/lib/server/trace/parameter-history";
import { matchParameters, traceScopes } from "@/lib/trace/parameter-search";
import { getPartFamilyHistory } from "@/lib/server/trace/part-family-history";
import { buildParameterTimeline, type VersionValue } from "@/lib/trace/timeline";
import { uncontrolledOrigin } from "@/lib/trace/labels";
import type { RichDoc } from "@/lib/documents/rich-text";
import { narrativeDocument } from "@/lib/changes/content";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";
import { referenceParameterHistory } from "./support/trace-reference";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-trace-"));
const people: Record<string, { id: string; name: string }> = {};
let valveBody = "";

/** A minor change of the valve body's wash temperature, driven through change control as a user would. */
async function changeWashTemperature(title: string, setpoint: string) {
  const cr = await openChangeRequest(people.engineer, {
    recipeId: valveBody,
    title,
    kind: "parameter_change",
  });
  const s = await loadChangeState(t.db, cr.id);
  const narrative = `Bath set to ${setpoint} °C after the detergent supplier's new batch.\n\nRisk: inside the range proven in the PQ; burn hazard at the tank as before.`;
  await saveProposal(
    people.engineer,
    proposalSchema.parse(
      proposalForm(s, (p) => p.key === "wash.temperature" && (p.setpoint = setpoint), { title }),
    ),
  );
  // The justification is a change-narrative document, saved through the documents editor's own service.
  const drafted = await loadChangeState(t.db, cr.id);
  await saveDraft(
    { ...people.engineer, roles: ["engineer"] },
    {
      versionId: drafted.narrative!.id,
      lockVersion: drafted.narrative!.lockVersion,
      content: narrativeDocument(narrative) as RichDoc,
      overwrite: false,
    },
  );
  const signing = async () => ({
    changeRequestId: cr.id,
    password: DEMO_PASSWORD,
    contentHash: (await loadChangeState(t.db, cr.id)).contentHash,
  });
  await assessChange(people.engineer, await signing());
  await approveChange(people.approver, await signing());
  await verifyChange(people.reviewer, await signing());
  await closeChange(people.approver, { changeRequestId: cr.id });
  return cr;
}

beforeAll(async () => {
  setStore(localStore(storeDir));
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "reviewer", "auditor"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
  valveBody = (await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB")))[0].id;
  await changeWashTemperature("Wash valve bodies at 62 °C", "62");
  await changeWashTemperature("Back to 58 °C for the softer alloy", "58");
});
afterAll(() => {
  setStore(undefined);
  t.cleanup();
  rmSync(storeDir, { recursive: true, force: true });
});

describe("parameter history", () => {
  it("reads the same history for every parameter as the one-change-at-a-time read did", async () => {
    const all = await listTraceableParameters();
    expect(all.length).toBeGreaterThan(20);
    let withChanges = 0;
    for (const p of all) {
      const batched = await getParameterHistory({ recipeId: p.recipeId, key: p.key });
      expect(batched).toEqual(
        await referenceParameterHistory({ recipeId: p.recipeId, key: p.key }),
      );
      if (batched?.entries.some((e) => e.change?.signatures.length && e.change.evidence.length))
        withChanges += 1;
    }
    // The comparison covers changes with signatures and evidence, not only parameters that never changed.
    expect(withChanges).toBeGreaterThan(0);
  });

  it("reads a parameter's history in the same number of statements however many changes it had", async () => {
    const statements = async (recipeId: string, key: string) => {
      forgetParameterHistories(); // a cold read, not the one remembered from the test above
      const spy = vi.spyOn(t.client, "execute");
      try {
        const h = (await getParameterHistory({ recipeId, key }))!;
        return { changes: h.entries.filter((e) => e.change).length, count: spy.mock.calls.length };
      } finally {
        spy.mockRestore();
      }
    };
    const busy = await statements(valveBody, "wash.temperature");
    const quiet = await statements(valveBody, "wash.time");
    expect(busy.changes).toBeGreaterThanOrEqual(2);
    expect(quiet.changes).toBe(0);
    // The audit chain's head, four statements for the recipe, its versions and parameters, then a
    // fixed set for all the changes together.
    expect(busy.count).toBeGreaterThan(quiet.count);
    expect(busy.count).toBeLessThanOrEqual(21);
    expect(quiet.count).toBeLessThanOrEqual(7);
  });

  it("lists every value a parameter that changed several times has had, in order, each with the change that brought it", async () => {
    const h = (await getParameterHistory({ recipeId: valveBody, key: "wash.temperature" }))!;
    expect(
      h.entries.map((e) => [
        e.period.value?.setpoint,
        e.period.status,
        e.period.change,
        e.change?.number ?? null,
      ]),
    ).toEqual([
      [55, "superseded", "first", null],
      [60, "superseded", "changed", "CR-2025-001"],
      [62, "superseded", "changed", expect.stringMatching(/^CR-\d{4}-\d{3}$/)],
      [58, "effective", "changed", expect.stringMatching(/^CR-\d{4}-\d{3}$/)],
    ]);
    // Periods follow each other without gap or overlap: each ends when the next takes effect.
    for (let i = 1; i < h.entries.length; i++)
      expect(h.entries[i - 1].period.effectiveTo).toBe(h.entries[i].period.effectiveFrom);
    expect(h.entries[3].period.effectiveTo).toBeNull();
    const last = h.entries[3].change!;
    expect(last.justification).toMatch(/^Bath set to 58 °C/);
    expect(last.signatures.map((s) => [s.meaning, s.printedName, s.binding])).toEqual([
      ["authored", people.engineer.name, "valid"],
      ["approved", people.approver.name, "valid"],
      ["verified", people.reviewer.name, "valid"],
    ]);
    expect(last.parameterImpact).toMatchObject({ impact: "minor", position: "inside" });
    expect(h.entries[1].change!.justification).toMatch(/^Heavier cutting-fluid carry-over/);
  });

  it("keeps a parameter that never changed as one period over all versions", async () => {
    const h = (await getParameterHistory({ recipeId: valveBody, key: "wash.time" }))!;
    expect(h.entries).toHaveLength(1);
    expect(h.entries[0].period.versions.map((v) => v.version)).toEqual([1, 2, 3, 4]);
    expect(h.entries[0].period.status).toBe("effective");
  });

  it("says when a first version took force, not the day the demo was loaded, and names the validation that proved its range", async () => {
    const h = (await getParameterHistory({ recipeId: valveBody, key: "wash.time" }))!;
    const [first] = h.entries;
    expect(first.change).toBeNull();
    // Effective date and PQ basis of the valve body's first version [db/seed-data.ts, db/seed-changes.ts].
    expect(first.period.effectiveFrom).toBe("2025-03-10T07:00:00.000Z");
    expect(first.validations).toEqual([
      expect.objectContaining({
        partFamily: "PF-VB-210",
        basis: "Valve body PQ (first validation)",
        qualifiedAt: "2025-03-10T00:00:00.000Z",
      }),
    ]);
    const words = uncontrolledOrigin({
      firstVersion: true,
      effectiveFrom: first.period.effectiveFrom,
      author: first.versionAuthor,
      enteredAt: "2026-12-02T15:00:00.000Z",
    });
    expect(words).toBe(
      `No change request: the recipe's first validated version, took force on 2025-03-10 (entered in Washproof by ${first.versionAuthor} on 2026-12-02).`,
    );
  });

  it("reaches from the seeded major change to its evidence: computed outcomes, signatures and file hashes", async () => {
    const [sf] = await t.db.select().from(recipes).where(eq(recipes.code, "R-SC1-SF"));
    const h = (await getParameterHistory({ recipeId: sf.id, key: "drying.temperature" }))!;
    expect(
      h.entries.map((e) => [
        e.period.value?.setpoint,
        e.period.value?.validatedLow,
        e.period.value?.validatedHigh,
      ]),
    ).toEqual([
      [90, 80, 100],
      [105, 95, 110],
    ]);
    const change = h.entries[1].change!;
    expect(change).toMatchObject({
      number: "CR-2026-001",
      impact: "major",
      status: "closed",
      parameterImpact: { position: "outside", impact: "major" },
    });
    expect(change.evidence.length).toBe(change.requirements.length);
    for (const run of change.evidence) {
      expect(run.outcome).toBe("pass");
      // The stored word is what the run's own raw data computes to, and the signatures bind to its content.
      expect((await computeStoredOutcome(t.db, run)).outcome).toBe("pass");
      const { hash } = await runContent(t.db, run);
      expect(run.signatures.map((s) => [s.meaning, s.contentHash]).sort()).toEqual([
        ["performed", hash],
        ["verified", hash],
      ]);
      expect(run.files.map((f) => f.kind)).toEqual(["lab_report", "photo"]);
      for (const f of run.files) expect(f.sha256).toMatch(/^[0-9a-f]{64}$/);
    }
    expect(new Set(change.evidence.flatMap((r) => r.files.map((f) => f.sha256))).size).toBe(
      change.evidence.length * 2,
    );
  });

  it("shows an open proposal after the value in force, and leaves out proposals that do not touch the parameter", async () => {
    const [ph] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-PH"));
    const pressure = (await getParameterHistory({
      recipeId: ph.id,
      key: "wash.injection_pressure",
    }))!;
    expect(
      pressure.entries.map((e) => [e.period.kind, e.period.value?.setpoint, e.period.status]),
    ).toEqual([
      ["in_force", 12, "effective"],
      ["proposal", 16, "proposed"],
    ]);
    expect(pressure.entries[1].change?.number).toBe("CR-2026-002");
    const time = (await getParameterHistory({ recipeId: ph.id, key: "wash.time" }))!;
    expect(time.entries.map((e) => e.period.kind)).toEqual(["in_force"]);
  });

  it("offers every recipe parameter once for the search, and finds nothing for an unknown key", async () => {
    const all = await listTraceableParameters();
    expect(
      all.filter((p) => p.recipeId === valveBody && p.key === "wash.temperature"),
    ).toHaveLength(1);
    expect(
      all.find((p) => p.recipeId === valveBody && p.key === "wash.temperature")?.versions,
    ).toBe(4);
    expect(await getParameterHistory({ recipeId: valveBody, key: "wash.nothing" })).toBeUndefined();
  });

  it("reads the newest entries in full and says how many older ones there are and what was in force before them", async () => {
    const whole = (await getParameterHistory({ recipeId: valveBody, key: "wash.temperature" }))!;
    expect(whole.entries.length).toBeGreaterThanOrEqual(3);
    expect(whole).not.toHaveProperty("older");
    for (const newest of [1, 2, whole.entries.length, whole.entries.length + 5]) {
      const paged = (await getParameterHistory(
        { recipeId: valveBody, key: "wash.temperature" },
        { newest },
      ))!;
      const hidden = Math.max(0, whole.entries.length - newest);
      // The entries shown are exactly the newest of the whole history, read the same way.
      expect(paged.entries).toEqual(whole.entries.slice(hidden));
      expect(paged.older?.count).toBe(hidden);
      expect(paged.older?.previous).toEqual(
        whole.entries.slice(0, hidden).findLast((e) => e.period.kind === "in_force")?.period.value,
      );
    }
  });

  it("answers the search with nothing chosen from the first systems' parameters and a count in SQL: the same as matching the whole plant's", async () => {
    const all = await listTraceableParameters();
    const opening = await searchTraceableParameters({});
    expect(opening).toEqual(matchParameters(all, {}));
    expect(opening.total).toBe(all.length);
    // The first systems' parameters fill the first page: the demo's first washer alone does not.
    expect(new Set(opening.items.map((p) => p.systemId)).size).toBeGreaterThan(1);
    for (const filter of [{ q: "temperature" }, { systemId: all.at(-1)!.systemId }, { q: "  " }])
      expect(await searchTraceableParameters(filter)).toEqual(matchParameters(all, filter));
  });

  it("lists a recipe's or a system's parameters alone, the same rows the plant-wide list holds for it", async () => {
    const all = await listTraceableParameters();
    const mine = await listTraceableParameters({ recipeId: valveBody });
    expect(mine.length).toBeGreaterThan(0);
    expect(mine).toEqual(all.filter((p) => p.recipeId === valveBody));
    const systemId = mine[0].systemId;
    expect(await listTraceableParameters({ systemId })).toEqual(
      all.filter((p) => p.systemId === systemId),
    );
    // The choosers read names only: every system with recipes, and a chosen system's recipes,
    // the same the plant-wide list holds; no recipe before a system is chosen.
    const scopes = await listTraceScopes();
    const expected = traceScopes(all);
    expect(scopes.systems).toEqual(expected.systems);
    expect(scopes.recipes).toEqual([]);
    for (const system of expected.systems)
      expect((await listTraceScopes(system.id)).recipes).toEqual(
        expected.recipes.filter((r) => r.systemId === system.id),
      );
  });

  it("timeline: a removed parameter ends a period, and a withdrawn proposal never counts as in force", () => {
    const v = (
      version: number,
      status: VersionValue["status"],
      setpoint: number | null,
      from: string | null,
    ): VersionValue => ({
      versionId: `v${version}`,
      version,
      status,
      effectiveFrom: from,
      effectiveTo: null,
      value:
        setpoint === null
          ? null
          : {
              name: "T",
              stage: "Wash",
              setpoint,
              unit: "°C",
              validatedLow: 50,
              validatedHigh: 70,
              critical: true,
            },
    });
    const out = buildParameterTimeline(
      [
        v(1, "superseded", 55, "2025-01-01"),
        v(2, "withdrawn", 80, null),
        v(3, "effective", null, "2025-06-01"),
      ],
      new Map([["v2", "v1"]]),
    );
    expect(out.map((p) => [p.kind, p.change, p.value?.setpoint ?? null])).toEqual([
      ["in_force", "first", 55],
      ["proposal", "proposed_change", 80],
      ["in_force", "removed", null],
    ]);
  });
});

describe("part family history", () => {
  it("names the recipe versions that cleaned a family and the runs on each", async () => {
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-SF-12"));
    const h = (await getPartFamilyHistory(family.id))!;
    const v2 = h.versions.find((v) => v.recipe.code === "R-SC1-SF" && v.version === 2)!;
    expect(v2.status).toBe("effective");
    expect(v2.runs.length).toBeGreaterThanOrEqual(2);
    expect(
      v2.runs.filter((r) => r.changeNumber === "CR-2026-001").every((r) => r.outcome === "pass"),
    ).toBe(true);
  });
});

describe("audit pack", () => {
  it(
    "lists every signature and every hash in the PDF, and the ZIP holds the files whose hashes it states",
    { timeout: 90_000 },
    async () => {
      const [cr] = await t.db
        .select()
        .from(changeRequests)
        .where(eq(changeRequests.number, "CR-2026-001"));
      const pack = await loadAuditPack(t.db, cr.id);
      const runSigs = pack.evidence.flatMap((r) => r.signatures);
      const fileHashes = pack.evidence.flatMap((r) => r.files.map((f) => f.sha256));
      expect(pack.signatures).toHaveLength(3);
      expect(fileHashes.length).toBe(pack.evidence.length * 2);
      expect(pack.chain.ok).toBe(true);
      expect(pack.events.map((e) => e.eventType)).toEqual(
        expect.arrayContaining([
          "change.opened",
          "change.closed",
          "signature.applied",
          "evidence_file.uploaded",
          "recipe_version.effective",
        ]),
      );

      const checkpoint = await writeCheckpoint("schedule");
      if (!checkpoint.written) throw new Error(checkpoint.reason);
      const pdf = await exportAuditPack(people.auditor, { changeRequestId: cr.id, format: "pdf" });
      const dir = mkdtempSync(join(tmpdir(), "washproof-pack-"));
      writeFileSync(join(dir, "pack.pdf"), pdf.bytes);
      const text = execFileSync("pdftotext", ["-layout", join(dir, "pack.pdf"), "-"], {
        encoding: "utf8",
      }).replace(/\s+/g, " ");
      rmSync(dir, { recursive: true, force: true });
      for (const s of [...pack.signatures, ...runSigs]) {
        expect(text).toContain(s.printedName);
        expect(text).toContain(s.contentHash);
      }
      for (const h of fileHashes) expect(text).toContain(h);
      // The anchor outside the database is printed whole, with the verdict against it.
      expect(text).toContain(checkpoint.checkpoint.signature);
      expect(text).toContain(checkpoint.checkpoint.hash);
      expect(text).toContain("The trail matches it");
      // The header names the plant the record belongs to (its name already carries the company's).
      expect(text).toContain(DEMO_SITE.name);
      expect(text).toContain("105 °C");
      expect(text).toContain("95–110 °C");

      const zip = await exportAuditPack(people.auditor, { changeRequestId: cr.id, format: "zip" });
      const entries = unzipSync(zip.bytes);
      const sums = strFromU8(entries.SHA256SUMS)
        .trim()
        .split("\n")
        .map((l) => l.split("  "));
      expect(sums.length).toBe(1 + fileHashes.length);
      for (const [hash, path] of sums) expect(sha256Hex(entries[path])).toBe(hash);
      expect(
        sums
          .slice(1)
          .map(([h]) => h)
          .sort(),
      ).toEqual([...fileHashes].sort());

      const exports = await t.db
        .select()
        .from(auditEvents)
        .where(eq(auditEvents.action, "audit_pack.exported"));
      expect(exports.map((e) => JSON.parse(e.newValue!).format)).toEqual(["pdf", "zip"]);
      expect(exports.every((e) => e.actorName === people.auditor.name)).toBe(true);
    },
  );
});

describe("a trace read again", () => {
  it("is read once per audit chain head, and again after any audited write", async () => {
    const input = { recipeId: valveBody, key: "wash.temperature" };
    const first = (await getParameterHistory(input, { newest: 10 }))!;
    // Nothing was written: the same history, not a second read.
    expect(await getParameterHistory(input, { newest: 10 })).toBe(first);
    const title = "Wash valve bodies at 60 °C again";
    await changeWashTemperature(title, "60");
    const after = (await getParameterHistory(input, { newest: 10 }))!;
    expect(after).not.toBe(first);
    expect(after.entries.at(-1)?.change?.title).toBe(title);
    expect(first.entries.some((e) => e.change?.title === title)).toBe(false);
    // And what it remembered is what a cold read gives.
    forgetParameterHistories();
    expect(await getParameterHistory(input, { newest: 10 })).toEqual(after);
  });
});
