import { mkdtempSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, setProcessDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { seedDemo } from "@/db/seed";
import {
  auditEvents,
  partFamilies,
  recipeVersions,
  requalificationIntervals,
  signatures,
  testSamples,
  testRuns,
  userRoles,
  users,
} from "@/db/schema";
import { verifyAuditChain } from "@/lib/audit";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { createRun } from "@/lib/server/evidence/create-run";
import {
  killGroup,
  startChild,
  startNextServer,
  waitUntilServing,
  type Child,
} from "./support/processes";

/**
 * The production server is killed with SIGKILL in the middle of a burst of
 * writes and restarted on the same files. What it acknowledged must still be
 * there, whole, and the database and the audit chain must be intact.
 *
 * Writers: lab results POSTed to /api/v1 with a read-write token (the API a lab
 * instrument uses), and "performed" signatures applied through the signing
 * service by a second process on the same database file — signing is a server
 * action behind a session and a password dialog, which raw HTTP cannot drive
 * realistically. Both processes are killed at the same instant.
 */
const BURST = 400; // requests offered; the kill comes long before they are all sent
const CONCURRENCY = 16;
const KILL_AFTER_ACKS = 40;
const RESULT_RUNS = 8;
const KILL_AFTER_SIGNATURES = 5;
/** The lab name the signer gives its runs, to find them afterwards. */
const SIGNER_LAB = "Crash-test signer";

const dir = mkdtempSync(join(tmpdir(), "washproof-crash-"));
const databaseUrl = `file:${join(dir, "washproof.db")}`;
let port = 0;
let baseUrl = "";
let server: Child | undefined;
let signer: Child | undefined;
let token = "";
let signerArgs: string[] = [];
const resultRuns: string[] = [];

async function freePort() {
  if (process.env.CRASH_TEST_PORT) return Number(process.env.CRASH_TEST_PORT);
  return new Promise<number>((resolve) => {
    const probe = createServer().listen(0, "127.0.0.1", () => {
      const { port: p } = probe.address() as { port: number };
      probe.close(() => resolve(p));
    });
  });
}

function serverEnv(): NodeJS.ProcessEnv {
  return {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    DATABASE_URL: databaseUrl,
    UPLOAD_DIR: join(dir, "uploads"),
    MAILBOX_FILE: join(dir, "mailbox.jsonl"),
    APP_URL: baseUrl,
    // Nothing listens there: queued e-mail stays in the outbox, as it would with the mail server down.
    SMTP_URL: `smtp://127.0.0.1:${port + 1000}`,
  };
}

beforeAll(async () => {
  port = await freePort();
  baseUrl = `http://127.0.0.1:${port}`;
  const { db, client } = openDatabase(databaseUrl);
  await migrateDatabase(db, client);
  // Before the seed: its change requests go through the services, which use the process database.
  setProcessDatabase(db, client);
  await seedDemo(db);
  const [tech] = await db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.email, "technician@fennmoor.example"));
  const [engineer] = await db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.email, "engineer@fennmoor.example"));
  const roles = (
    await db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, tech.id))
  ).map((r) => r.role);
  token = (
    await createApiToken({ ...tech, email: "", roles, mustChangePassword: false } as never, {
      name: "Crash test",
      scope: "read_write",
    })
  ).token;
  const [family] = await db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  // The valve body's effective recipe, on which it is qualified: runs are refused off a qualified combination.
  const [{ version }] = await db
    .select({ version: recipeVersions })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .where(
      and(
        eq(requalificationIntervals.partFamilyId, family.id),
        eq(recipeVersions.status, "effective"),
      ),
    );
  const open = () =>
    createRun(engineer, {
      partFamilyId: family.id,
      recipeVersionId: version.id,
      testType: "gravimetric",
      technicianId: tech.id,
      lab: "Larchfield lab",
      performedOn: "2026-03-02",
    });
  for (let i = 0; i < RESULT_RUNS; i++) resultRuns.push((await open()).id);
  signerArgs = [family.id, version.id, SIGNER_LAB];
  client.close();
}, 90_000);

afterAll(async () => {
  if (signer) await killGroup(signer, "SIGKILL");
  if (server) await killGroup(server, "SIGTERM");
  rmSync(dir, { recursive: true, force: true });
});

function postResult(runId: string, sampleLabel: string) {
  return fetch(`${baseUrl}/api/v1/test-runs/${runId}/samples`, {
    method: "POST",
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify({
      sampleLabel,
      worstCase: false,
      components: 5,
      filterBeforeMg: 100.2,
      filterAfterMg: 100.6,
    }),
  });
}

describe("a SIGKILL in the middle of a burst of writes", () => {
  it("loses no acknowledged write, leaves no half transaction, and the restarted server carries on", async () => {
    server = startNextServer(port, serverEnv());
    const firstStartMs = await waitUntilServing(baseUrl, server);

    // The second writer: ready once its modules are loaded, then it signs as fast as it can.
    const signed = new Set<string>();
    let signerReady!: () => void;
    const ready = new Promise<void>((r) => (signerReady = r));
    signer = startChild(
      "npx",
      ["tsx", "--conditions", "react-server", "tests/build/support/sign-runs.ts", ...signerArgs],
      serverEnv(),
      (line) => {
        if (line === "ready") signerReady();
        if (line.startsWith("signed ")) signed.add(line.slice("signed ".length));
      },
    );
    await ready;

    const acked: { runId: string; sampleLabel: string }[] = [];
    const refused: number[] = [];
    let sent = 0;
    let inFlight = 0;
    let inFlightAtKill = 0;
    let signedAtKill = 0;
    let killedAtMs = 0;
    let killed = false;
    const started = performance.now();
    const kill = () => {
      killed = true;
      killedAtMs = performance.now() - started;
      inFlightAtKill = inFlight;
      signedAtKill = signed.size;
      process.kill(-server!.process.pid!, "SIGKILL");
      process.kill(-signer!.process.pid!, "SIGKILL");
    };
    const worker = async () => {
      while (!killed && sent < BURST) {
        const i = sent++;
        const write = {
          runId: resultRuns[i % RESULT_RUNS],
          sampleLabel: `B-${String(i).padStart(3, "0")}`,
        };
        inFlight++;
        try {
          const res = await postResult(write.runId, write.sampleLabel);
          // The status line is the acknowledgement: the handler answers only after its transaction committed.
          if (res.status === 201) acked.push(write);
          else refused.push(res.status);
          if (acked.length >= KILL_AFTER_ACKS && signed.size >= KILL_AFTER_SIGNATURES && !killed)
            kill();
          await res.body?.cancel();
        } catch {
          // the connection died with the server: not acknowledged
        } finally {
          inFlight--;
        }
      }
    };
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    await Promise.all([server.exited, signer.exited]);
    // A line is printed only after its signing committed, so every line received is an acknowledgement.
    const ackedSignatures = [...signed];

    expect(killed, "the burst ended before the kill").toBe(true);
    expect(refused, "no write was refused before the kill").toEqual([]);
    expect(
      inFlightAtKill,
      "writes were still in flight when the server was killed",
    ).toBeGreaterThan(0);
    expect(signer.output(), "the signer was signing until the kill").not.toMatch(/Error/);

    server = startNextServer(port, serverEnv());
    const restartMs = await waitUntilServing(baseUrl, server);

    const { db, client } = openDatabase(databaseUrl);
    try {
      expect(
        (await client.execute("PRAGMA integrity_check")).rows.map((r) => r.integrity_check),
      ).toEqual(["ok"]);
      const chain = await verifyAuditChain(db);
      expect(chain).toMatchObject({ ok: true });

      // Every acknowledged result is there, and every stored result has exactly its audit event (all or nothing).
      const rows = await db
        .select()
        .from(testSamples)
        .where(inArray(testSamples.runId, resultRuns));
      const stored = new Set(rows.map((r) => `${r.runId}/${r.sampleLabel}`));
      expect(
        acked.filter((w) => !stored.has(`${w.runId}/${w.sampleLabel}`)),
        "acknowledged results missing after the restart",
      ).toEqual([]);
      const added = await db
        .select()
        .from(auditEvents)
        .where(
          and(
            eq(auditEvents.action, "test_run.sample_added"),
            inArray(auditEvents.recordId, resultRuns),
          ),
        );
      expect(added.map((e) => JSON.parse(e.newValue!).sampleId).sort()).toEqual(
        rows.map((r) => r.id).sort(),
      );

      // Every acknowledged signature is there; a run is performed exactly when it carries its signature and its event.
      const runs = await db
        .select({ id: testRuns.id, status: testRuns.status })
        .from(testRuns)
        .where(eq(testRuns.lab, SIGNER_LAB));
      const signRuns = runs.map((r) => r.id);
      const sigs = await db
        .select()
        .from(signatures)
        .where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, signRuns)));
      const signedRuns = new Set(sigs.map((s) => s.recordId));
      expect(
        ackedSignatures.filter((id) => !signedRuns.has(id)),
        "acknowledged signatures missing after the restart",
      ).toEqual([]);
      for (const run of runs)
        expect(run.status, run.id).toBe(signedRuns.has(run.id) ? "performed" : "open");
      const performed = await db
        .select()
        .from(auditEvents)
        .where(
          and(
            eq(auditEvents.action, "test_run.performed"),
            inArray(auditEvents.recordId, signRuns),
          ),
        );
      expect(new Set(performed.map((e) => e.recordId))).toEqual(signedRuns);

      // The restarted server takes new writes on the recovered files.
      const after = await postResult(resultRuns[0], "AFTER-RESTART");
      expect(after.status).toBe(201);

      console.log(
        [
          `crash test: first start ${Math.round(firstStartMs)} ms; ${sent} results sent at concurrency ${CONCURRENCY},`,
          `${acked.length} acknowledged, ${inFlightAtKill} in flight at the kill (${Math.round(killedAtMs)} ms into the burst);`,
          `${rows.length} results stored (${rows.length - acked.length} committed without an acknowledgement);`,
          `signer: ${signedAtKill} signatures acknowledged at the kill, ${ackedSignatures.length} in all, ${signedRuns.size} stored, ${runs.length} runs opened;`,
          `restart to serving ${Math.round(restartMs)} ms; audit chain ${chain.events} events intact.`,
        ].join(" "),
      );
    } finally {
      client.close();
    }
  }, 120_000);
});
