import { mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq, inArray } from "drizzle-orm";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { emailOutbox, signatures, testRuns } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { appendAudit, verifyAuditChain } from "@/lib/audit";
import { generateSigningKeyPem, parseSigningKey, signCheckpoint } from "@/lib/audit/checkpoint";
import { chainHash } from "@/lib/audit/hash";
import { localStore, setStore } from "@/lib/storage";
import {
  checkpointName,
  localCheckpointStore,
  setCheckpointStore,
} from "@/lib/storage/checkpoints";
import { checkIntegrity } from "@/lib/server/audit/check-integrity";
import { setSigningKey } from "@/lib/server/audit/signing-key";
import { writeCheckpoint } from "@/lib/server/audit/write-checkpoint";
import { refreshOutcome } from "@/lib/server/evidence/refresh-outcome";
import { runContent } from "@/lib/server/evidence/run-content";
import { createTestDatabase } from "./support/test-db";

// Read once by lib/env on first use, which comes after this line.
process.env.AUDITOR_EMAIL = "auditor@example.org";

type TestDb = Awaited<ReturnType<typeof createTestDatabase>>;
let t: TestDb;
let dir: string;
const actor = { id: "u-1", name: "Test Engineer" };

async function append(db: TestDb, n: number) {
  for (let i = 0; i < n; i++) {
    await db.db.transaction((tx) =>
      appendAudit(tx, actor, {
        eventType: "audit.exported",
        recordType: "audit_trail",
        recordId: `r-${i}`,
        new: { filters: { n: i } },
        reason: `step ${i}`,
      }),
    );
  }
}

// ── What an attacker with write access to the database file does: raw SQL, triggers dropped. ──
async function dropTriggers(db: TestDb) {
  await db.client.execute("DROP TRIGGER IF EXISTS audit_events_no_update");
  await db.client.execute("DROP TRIGGER IF EXISTS audit_events_no_delete");
}

/** Recomputes prev_hash and hash of every row from `from` on, so the chain checks out again. */
async function rechain(db: TestDb, from: number) {
  const rows = (await db.client.execute("SELECT * FROM audit_events ORDER BY seq")).rows;
  let prev = "0".repeat(64);
  for (const r of rows) {
    const seq = Number(r.seq);
    if (seq >= from) {
      const hash = chainHash({
        seq,
        at: String(r.at),
        actorId: r.actor_id as string | null,
        actorName: String(r.actor_name),
        action: String(r.action),
        recordType: String(r.record_type),
        recordId: String(r.record_id),
        oldValue: r.old_value as string | null,
        newValue: r.new_value as string | null,
        reason: r.reason as string | null,
        prevHash: prev,
      });
      await db.client.execute({
        sql: "UPDATE audit_events SET prev_hash = ?, hash = ? WHERE seq = ?",
        args: [prev, hash, seq],
      });
      prev = hash;
    } else prev = String(r.hash);
  }
}

async function shift(db: TestDb, from: number, by: number) {
  // Two steps so no intermediate number collides with the primary key.
  await db.client.execute({
    sql: "UPDATE audit_events SET seq = seq + 1000000 WHERE seq >= ?",
    args: [from],
  });
  await db.client.execute({
    sql: "UPDATE audit_events SET seq = seq - 1000000 + ? WHERE seq >= 1000000",
    args: [by],
  });
  await db.client.execute(
    "UPDATE sqlite_sequence SET seq = (SELECT max(seq) FROM audit_events) WHERE name = 'audit_events'",
  );
}

async function expectOnlyCheckpointsCatchIt(db: TestDb, pattern: RegExp) {
  // The rewrite is internally consistent: the chain alone sees nothing.
  expect(await verifyAuditChain(db.db)).toMatchObject({ ok: true });
  const report = await checkIntegrity(db.db);
  expect(report.ok).toBe(false);
  expect(report.checkpoints.breaks.map((b) => b.reason)).toEqual([expect.stringMatching(pattern)]);
  return report;
}

describe("checkpoints outside the database", () => {
  beforeEach(async () => {
    t = await createTestDatabase();
    dir = mkdtempSync(join(tmpdir(), "washproof-checkpoints-"));
    setCheckpointStore(localCheckpointStore(dir));
    setSigningKey(generateSigningKeyPem());
  });
  afterEach(() => {
    t.cleanup();
    rmSync(dir, { recursive: true, force: true });
  });

  it("are signed, stored in the evidence store, e-mailed to the auditor, and skipped by the schedule when the head has not moved", async () => {
    await append(t, 5);
    const first = await writeCheckpoint("schedule");
    expect(first).toMatchObject({
      written: true,
      checkpoint: { seq: 5, by: "schedule" },
      emailedTo: "auditor@example.org",
    });
    expect(readdirSync(join(dir, "audit-checkpoints"))).toHaveLength(1);
    expect(await writeCheckpoint("schedule")).toMatchObject({ written: false });
    // On demand always writes, and names who asked.
    expect(await writeCheckpoint(actor)).toMatchObject({
      written: true,
      checkpoint: { seq: 5, by: "Test Engineer" },
    });
    // A person's checkpoint is itself recorded, after it was signed: the next scheduled one covers that event.
    const [event] = (
      await t.client.execute("SELECT seq, action, new_value FROM audit_events WHERE seq = 6")
    ).rows;
    expect(event).toMatchObject({ action: "audit.checkpointed" });
    expect(await writeCheckpoint("schedule")).toMatchObject({
      written: true,
      checkpoint: { seq: 6 },
    });
    const mail = await t.db
      .select()
      .from(emailOutbox)
      .where(eq(emailOutbox.to, "auditor@example.org"));
    expect(mail).toHaveLength(3);
    expect(mail[0].text).toContain(first.written ? first.checkpoint.signature : "?");
    const report = await checkIntegrity(t.db);
    expect(report).toMatchObject({
      ok: true,
      findings: [],
      checkpoints: { count: 3, uncovered: 0 },
    });
  });

  it("detect an edit re-chained from the edited event on", async () => {
    await append(t, 8);
    await writeCheckpoint("schedule");
    await append(t, 2);
    await dropTriggers(t);
    await t.client.execute("UPDATE audit_events SET reason = 'nothing happened' WHERE seq = 3");
    await rechain(t, 3);
    await expectOnlyCheckpointsCatchIt(
      t,
      /event 8 no longer has the hash signed .*events 1–8 were rewritten/,
    );
  });

  it("detect a forged event inserted and the rest renumbered", async () => {
    await append(t, 8);
    await writeCheckpoint("schedule");
    await dropTriggers(t);
    await shift(t, 4, 1);
    await t.client.execute(
      `INSERT INTO audit_events (seq, at, actor_id, actor_name, action, record_type, record_id, old_value, new_value, reason, prev_hash, hash)
       VALUES (4, '2026-01-01T00:00:00.000Z', 'u-9', 'Forger', 'user.updated', 'user', 'r-x', NULL, '{"n":42}', 'backdated', '', '')`,
    );
    await rechain(t, 4);
    await expectOnlyCheckpointsCatchIt(t, /event 8 no longer has the hash signed/);
  });

  it("detect an event deleted and the rest renumbered", async () => {
    await append(t, 8);
    await writeCheckpoint("schedule");
    await append(t, 1);
    await dropTriggers(t);
    await t.client.execute("DELETE FROM audit_events WHERE seq = 4");
    await shift(t, 5, -1);
    await rechain(t, 4);
    await expectOnlyCheckpointsCatchIt(t, /event 8 no longer has the hash signed/);
  });

  it("detect the tail cut off with the counter reset", async () => {
    await append(t, 8);
    await writeCheckpoint("schedule");
    await dropTriggers(t);
    await t.client.execute("DELETE FROM audit_events WHERE seq > 5");
    await t.client.execute("UPDATE sqlite_sequence SET seq = 5 WHERE name = 'audit_events'");
    await expectOnlyCheckpointsCatchIt(
      t,
      /holds event 8, but the trail now ends at event 5: events 6–8 at least were cut off/,
    );
  });

  it("refuse a checkpoint signed with another key, and pin the span between two good ones", async () => {
    await append(t, 4);
    await writeCheckpoint("schedule");
    await append(t, 4);
    await writeCheckpoint("schedule");
    const forged = signCheckpoint(
      { seq: 8, hash: "f".repeat(64) },
      parseSigningKey(generateSigningKeyPem()),
      "schedule",
    );
    writeFileSync(
      join(dir, "audit-checkpoints", checkpointName(8, "2026-12-31T00:00:00.000Z")),
      JSON.stringify(forged),
    );
    await dropTriggers(t);
    await t.client.execute("UPDATE audit_events SET reason = 'quietly changed' WHERE seq = 6");
    await rechain(t, 6);
    const report = await checkIntegrity(t.db);
    expect(report.checkpoints.breaks.map((b) => b.reason)).toEqual([
      expect.stringMatching(/event 8 no longer has the hash signed .*events 5–8 were rewritten/),
      expect.stringMatching(/not signed by this installation's key/),
    ]);
  });
});

describe("signatures re-checked against the record as stored", () => {
  let demo: TestDb;
  let blobs: string;
  beforeAll(async () => {
    // The process database, with its own checkpoint folder, for every test below.
    demo = await createTestDatabase();
    setSigningKey(generateSigningKeyPem());
    blobs = mkdtempSync(join(tmpdir(), "washproof-blobs-"));
    setStore(localStore(blobs));
    await seedDemo(demo.db);
  }, 60_000);
  afterAll(() => {
    demo.cleanup();
    rmSync(blobs, { recursive: true, force: true });
  });

  it("find nothing wrong in the seeded demo", async () => {
    const report = await checkIntegrity(demo.db);
    expect(report.findings).toEqual([]);
    expect(report.signatures.checked).toBeGreaterThan(0);
  });

  it("name a signed run whose data were changed and whose signature hash was made to fit", async () => {
    const signedRunIds = (
      await demo.db
        .select({ id: signatures.recordId })
        .from(signatures)
        .where(eq(signatures.recordType, "test_run"))
    ).map((r) => r.id);
    const [run] = await demo.db
      .select()
      .from(testRuns)
      .where(and(inArray(testRuns.id, signedRunIds), eq(testRuns.outcome, "fail")))
      .limit(1);
    expect(run).toBeDefined();
    expect(await writeCheckpoint("schedule")).toMatchObject({ written: true });
    // The attacker empties the counts so the run passes, stores the new word, and re-binds the signatures.
    await demo.client.execute({
      sql: "UPDATE test_samples SET data = json_set(data, '$.counts', json('{}')) WHERE run_id = ?",
      args: [run.id],
    });
    await refreshOutcome(demo.db, run);
    const after = (await demo.db.select().from(testRuns).where(eq(testRuns.id, run.id)))[0];
    const { hash } = await runContent(demo.db, after);
    await demo.client.execute({
      sql: "UPDATE signatures SET content_hash = ? WHERE record_id = ?",
      args: [hash, run.id],
    });

    const report = await checkIntegrity(demo.db);
    expect(report.chain.ok).toBe(true);
    const mine = report.signatures.findings
      .filter((f) => f.recordId === run.id)
      .map((f) => f.message);
    expect(mine).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/was altered after signing/),
        expect.stringContaining(`Test run ${run.number} was changed after`),
      ]),
    );
  });

  it("and when the signing events are rewritten to fit as well, the checkpoint names the rewrite", async () => {
    // Continues the attack above: the forger now also edits the signing events and re-chains.
    await dropTriggers(demo);
    const sigs = (
      await demo.client.execute(
        "SELECT s.id, s.content_hash FROM signatures s JOIN test_runs r ON r.id = s.record_id WHERE s.record_type = 'test_run'",
      )
    ).rows;
    let first = Infinity;
    for (const sig of sigs) {
      const [event] = (
        await demo.client.execute({
          sql: "SELECT seq FROM audit_events WHERE action = 'signature.applied' AND record_id = ?",
          args: [sig.id],
        })
      ).rows;
      await demo.client.execute({
        sql: "UPDATE audit_events SET new_value = json_set(new_value, '$.contentHash', ?) WHERE seq = ?",
        args: [sig.content_hash, event.seq],
      });
      first = Math.min(first, Number(event.seq));
    }
    await rechain(demo, first);
    const report = await checkIntegrity(demo.db);
    expect(report.chain.ok).toBe(true);
    expect(report.signatures.findings).toEqual([]);
    expect(report.checkpoints.breaks).toEqual([
      expect.objectContaining({ reason: expect.stringMatching(/were rewritten/) }),
    ]);
    expect(report.ok).toBe(false);
  });
});
