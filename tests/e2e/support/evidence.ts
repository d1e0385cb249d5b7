import { createClient } from "@libsql/client";
import type { Browser } from "@playwright/test";
import { resolve } from "node:path";

const TYPES: Record<string, string> = { "Particle cleanliness": "particle_cleanliness", "Gravimetric residue": "gravimetric" };

/**
 * Passing, second-person-verified requalification runs on the proposed version.
 * Written straight into the e2e database because no evidence-recording screen exists on this branch yet.
 */
export async function recordPassingEvidence(_browser: Browser, input: { recipe: string; version: number; tests: { type: string; samples: number }[] }) {
  const db = createClient({ url: `file:${resolve("data/e2e/washproof.db")}`, timeout: 10_000 } as Parameters<typeof createClient>[0]);
  const one = async (sql: string, args: (string | number)[]) => (await db.execute({ sql, args })).rows[0];
  const version = await one("select v.id from recipe_versions v join recipes r on r.id = v.recipe_id where r.code = ? and v.version = ?", [input.recipe, input.version]);
  const family = await one("select id from part_families where code = 'PF-VB-210'", []);
  const cr = await one("select id from change_requests where to_version_id = ?", [String(version.id)]);
  const tech = await one("select id from users where email = 'technician@fennmoor.example'", []);
  const eng = await one("select id from users where email = 'engineer@fennmoor.example'", []);
  const now = new Date().toISOString();
  for (const [i, t] of input.tests.entries()) {
    const runId = crypto.randomUUID();
    await db.execute({
      sql: "insert into test_runs (id, number, part_family_id, recipe_version_id, change_request_id, test_type, status, outcome, revision, created_by, created_at) values (?, ?, ?, ?, ?, ?, 'verified', 'pass', 1, ?, ?)",
      args: [runId, `E2E-${Date.now()}-${i}`, String(family.id), String(version.id), String(cr.id), TYPES[t.type], String(tech.id), now],
    });
    for (let s = 0; s < t.samples; s++) {
      await db.execute({ sql: "insert into test_results (id, run_id, sample_label, worst_case, data, created_at) values (?, ?, ?, 0, '{}', ?)", args: [crypto.randomUUID(), runId, `S${s + 1}`, now] });
    }
    for (const [who, meaning] of [[tech, "performed"], [eng, "verified"]] as const) {
      await db.execute({ sql: "insert into signatures (id, record_type, record_id, user_id, printed_name, meaning, signed_at, content_hash) values (?, 'test_run', ?, ?, 'e2e', ?, ?, 'h')", args: [crypto.randomUUID(), runId, String(who.id), meaning, now] });
    }
  }
  db.close();
}
