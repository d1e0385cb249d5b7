/**
 * The slow services of the plant benchmark measured in this process, without a server or a
 * build, each beside its anchor in the same run: My queue and the trace of the busy parameter
 * against the same answer read the way it was read before (statement counts included), and
 * audit verification against raw SHA-256 over the same bytes. For quick before/after checks
 * on a shared machine; `npm run bench` stays the measure of record.
 *
 *   npx tsx --conditions=react-server tests/bench/services.ts --scale=ci [--reuse]
 *
 * `--conditions=react-server` lets the server-only modules load outside Next.js.
 */
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readFileSync } from "node:fs";
import { resolve } from "node:path";
import { and, eq } from "drizzle-orm";
import { openDatabase, setProcessDatabase } from "@/db/client";
import { userRoles, users } from "@/db/schema";
import { verifyAuditChain } from "@/lib/audit";
import { getQueue } from "@/lib/server/queue/get-queue";
import {
  forgetParameterHistories,
  getParameterHistory,
  listTraceableParameters,
  listTraceScopes,
} from "@/lib/server/trace/parameter-history";
import { TRACE_ENTRIES_PAGE } from "@/lib/schemas/trace";
import { referenceParameterHistory } from "../unit/support/trace-reference";
import { scaleFromArgs } from "./plant-scale";
import { seedPlant } from "./seed-plant";
import { rawTraceRows } from "./trace-anchor";

const scale = scaleFromArgs(process.argv.slice(2), process.env);
const reuse = process.argv.includes("--reuse");
const REPEAT = Number(process.env.BENCH_REPEAT ?? 15);
const dir = resolve("data/bench");
const dbPath = `${dir}/services-${scale.name}.db`;
const loads: string[] = [];
const load = () =>
  loads.push(readFileSync("/proc/loadavg", "utf8").split(" ").slice(0, 3).join(" "));
load();

mkdirSync(dir, { recursive: true });
if (!reuse || !existsSync(dbPath)) {
  console.log(`Seeding the ${scale.name}-size plant into ${dbPath} …`);
  await seedPlant(scale, dbPath, 4, () => undefined);
}
const { db, client } = openDatabase(`file:${dbPath}`);
setProcessDatabase(db, client);

// Counts the statements a call sends through the driver.
let statements = 0;
const execute = client.execute.bind(client);
client.execute = ((...args: Parameters<typeof execute>) => {
  statements += 1;
  return execute(...args);
}) as typeof client.execute;

async function time<T>(fn: () => Promise<T>) {
  await fn(); // warm: prepared statements, JIT
  const ms: number[] = [];
  let perCall = 0;
  let result: T | undefined;
  for (let i = 0; i < REPEAT; i++) {
    statements = 0;
    const t0 = performance.now();
    result = await fn();
    ms.push(performance.now() - t0);
    perCall = statements;
  }
  ms.sort((a, b) => a - b);
  const at = (q: number) => ms[Math.min(ms.length - 1, Math.floor(q * ms.length))];
  return { p50: at(0.5), p95: at(0.95), statements: perCall, result: result as T };
}

const [engineer] = await db
  .select({ id: users.id, name: users.name, email: users.email })
  .from(users)
  .innerJoin(userRoles, eq(userRoles.userId, users.id))
  .where(and(eq(users.email, "engineer@fennmoor.example"), eq(userRoles.role, "engineer")));
const user = {
  ...engineer,
  roles: ["engineer" as const],
  mustChangePassword: false,
  sessionId: "bench",
};

const lines: string[] = [];
const row = (name: string, r: { p50: number; p95: number; statements: number }, note = "") =>
  lines.push(`| ${name} | ${r.p50.toFixed(1)} | ${r.p95.toFixed(1)} | ${r.statements} | ${note} |`);

// ── My queue: the first page of each kind, beside the raw read of the same waiting runs ──
const queue = await time(() => getQueue(user));
const rawQueue = await time(async () => {
  const perform = await client.execute({
    sql: "select r.id, r.number, r.revision, r.test_type, r.lab, r.performed_on, f.code from test_runs r indexed by test_runs_status_idx join part_families f on f.id = r.part_family_id where r.status = 'open' and (r.technician_id = ? or r.created_by = ?) order by r.performed_on is null, r.performed_on, r.number, r.revision limit 50",
    args: [user.id, user.id],
  });
  const verify = await client.execute({
    sql: "select r.id, r.number, r.revision, r.test_type, r.lab, r.performed_on, f.code from test_runs r indexed by test_runs_status_idx join part_families f on f.id = r.part_family_id where r.status = 'performed' and not exists (select 1 from signatures s where s.record_type = 'test_run' and s.record_id = r.id and s.user_id = ?) order by r.number, r.revision limit 50",
    args: [user.id],
  });
  return perform.rows.length + verify.rows.length;
});
row(
  "My queue (getQueue, first page per kind)",
  queue,
  `${queue.result.items.length} items, ${JSON.stringify(Object.fromEntries(queue.result.kinds.map((k) => [k.kind, k.total])))}`,
);
row("  anchor: raw SQL, the two run pages", rawQueue);
load();

// ── Trace of the busy parameter: batched, beside the one-change-at-a-time read ──
const busy = await client.execute("select id from recipes where code = 'R-W01-001'");
const input = { recipeId: String(busy.rows[0].id), key: "wash.temperature" };
// Cold reads, as after a write: a read again under an unchanged audit chain is remembered.
const cold = <T>(read: () => Promise<T>) => {
  forgetParameterHistories();
  return read();
};
const trace = await time(() => cold(() => getParameterHistory(input)));
const before = await time(() => referenceParameterHistory(input));
const same = JSON.stringify(trace.result) === JSON.stringify(before.result);
row(
  "Trace of the busy parameter (batched, whole history)",
  trace,
  `${trace.result?.entries.length} periods; same answer as before: ${same}`,
);
row("  anchor: the read before batching", before);
// What the trace page itself reads: the choosers' names, the recipe's parameters for the list and
// the newest entries of the timeline; beside it the same rows read with hand-written SQL.
const pageReads = await time(() =>
  cold(() =>
    Promise.all([
      listTraceScopes(),
      listTraceableParameters({ recipeId: input.recipeId }),
      getParameterHistory(input, { newest: TRACE_ENTRIES_PAGE }),
    ]),
  ),
);
const raw = await time(() => rawTraceRows(client, input.recipeId, input.key, TRACE_ENTRIES_PAGE));
const picker = await time(() => listTraceableParameters());
row(
  `Trace page's reads (choosers, the recipe's parameters, newest ${TRACE_ENTRIES_PAGE} entries)`,
  pageReads,
  `${(pageReads.p50 / raw.p50).toFixed(1)}× the raw SQL at p50, ${(pageReads.p95 / raw.p95).toFixed(1)}× at p95`,
);
row(`  anchor: raw SQL for the same rows`, raw, `${raw.result} rows`);
row(
  "  before: the picker's plant-wide list, read on every view",
  picker,
  `${picker.result.length} parameters`,
);
load();

// ── Audit verification beside raw SHA-256 of the same text ──
const t0 = performance.now();
const verified = await verifyAuditChain(db);
const verifySeconds = (performance.now() - t0) / 1000;
let bytes = 0;
let rawMs = 0;
for (let seq = 0; ;) {
  const page = await execute({
    sql: "SELECT * FROM audit_events WHERE seq > ? ORDER BY seq LIMIT 5000",
    args: [seq],
  });
  if (page.rows.length === 0) break;
  const texts = page.rows.map((r) =>
    JSON.stringify([
      r.prev_hash,
      r.seq,
      r.at,
      r.actor_id,
      r.actor_name,
      r.action,
      r.record_type,
      r.record_id,
      r.old_value,
      r.new_value,
      r.reason,
    ]),
  );
  const started = performance.now();
  for (const t of texts) createHash("sha256").update(t).digest("hex");
  rawMs += performance.now() - started;
  for (const t of texts) bytes += Buffer.byteLength(t);
  seq = Number(page.rows[page.rows.length - 1].seq);
}
load();

console.log(
  `\nServices in process, ${scale.name} size, ${REPEAT} calls each after one warm-up; load average ${loads.join(" → ")}\n`,
);
console.log("| path | p50 ms | p95 ms | statements per call | note |\n|---|---:|---:|---:|---|");
console.log(lines.join("\n"));
console.log(
  `\nAudit chain: ${verified.events.toLocaleString("en")} events (${verified.ok ? "verified" : "BROKEN"}), ${(bytes / 1e6).toFixed(1)} MB: verifyAuditChain ${verifySeconds.toFixed(2)} s, raw SHA-256 ${(rawMs / 1000).toFixed(2)} s → ${((rawMs / 1000 / verifySeconds) * 100).toFixed(1)} % of raw (target ≥ 50 %).`,
);
client.close();
