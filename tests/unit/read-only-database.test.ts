import { execFileSync } from "node:child_process";
import { chmodSync } from "node:fs";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { openDatabase, setProcessDatabase } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { SESSION_COOKIE } from "@/lib/auth/session-cookie";
import { createSession } from "@/lib/server/auth/sessions";
import { peopleByRole } from "./support/endpoints";
import { setSessionCookie } from "./support/request-context";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

const { GET: listRunsApi } = await import("@/app/api/v1/test-runs/route");
const { POST: addSampleApi } = await import("@/app/api/v1/test-runs/[runId]/samples/route");
const { GET: listRunsSession } = await import("@/app/api/evidence/runs/route");
const { reviseRunAction } = await import("@/app/(app)/evidence/actions");

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let path = "";
let people: Awaited<ReturnType<typeof peopleByRole>>;
let sessionToken = "";
let openRunId = "";
let verifiedRunId = "";
let readOnly: { undo(): void } | null = null;

/**
 * Makes the database file itself refuse writes, as a disk remounted read-only or a file whose
 * permissions were changed would: root ignores permission bits, so as root the file is made
 * immutable instead (needs CAP_LINUX_IMMUTABLE, which this machine's root has).
 */
function makeReadOnly(file: string) {
  if (process.getuid?.() === 0) {
    execFileSync("chattr", ["+i", file]);
    return { undo: () => execFileSync("chattr", ["-i", file]) };
  }
  chmodSync(file, 0o444);
  return { undo: () => chmodSync(file, 0o644) };
}

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  sessionToken = (await createSession(people.engineer.id)).token;
  const runs = await t.client.execute("SELECT id, status, test_type FROM test_runs");
  openRunId = String(
    runs.rows.find((r) => r.status === "open" && r.test_type === "particle_cleanliness")!.id,
  );
  verifiedRunId = String(runs.rows.find((r) => r.status === "verified")!.id);
  // Everything written so far goes into the main file, then the file is closed and made read-only.
  await t.client.execute("PRAGMA wal_checkpoint(TRUNCATE)");
  t.client.close();
  path = t.url.slice("file:".length);
  readOnly = makeReadOnly(path);
  const reopened = openDatabase(t.url);
  setProcessDatabase(reopened.db, reopened.client);
  t = { ...t, ...reopened };
}, 60_000);

afterAll(() => {
  readOnly?.undo();
  t.cleanup();
});

const get = (url: string, headers: Record<string, string> = {}) =>
  new NextRequest(url, { headers });

describe("a database file that refuses writes", () => {
  it("is really read-only: a direct write fails with SQLITE_READONLY", async () => {
    await expect(t.client.execute("UPDATE users SET name = name")).rejects.toMatchObject({
      code: expect.stringMatching(/^SQLITE_READONLY/),
    });
  });

  it("still answers reads, by API token and by session, though the token's last use cannot be recorded", async () => {
    const api = await listRunsApi(
      get("http://127.0.0.1/api/v1/test-runs", {
        authorization: `Bearer ${people.engineer.readToken}`,
      }),
      { params: Promise.resolve({}) },
    );
    expect(api.status).toBe(200);
    expect(((await api.json()) as { data: unknown[] }).data.length).toBeGreaterThan(0);
    setSessionCookie(SESSION_COOKIE, sessionToken);
    const page = await listRunsSession(get("http://127.0.0.1/api/evidence/runs"), {
      params: Promise.resolve({}),
    });
    expect(page.status).toBe(200);
  });

  it("answers a write through the API with 503 and a sentence that says the database is read-only", async () => {
    const request = new NextRequest(`http://127.0.0.1/api/v1/test-runs/${openRunId}/samples`, {
      method: "POST",
      headers: {
        authorization: `Bearer ${people.technician.writeToken}`,
        "content-type": "application/json",
      },
      body: JSON.stringify({ sampleLabel: "RO-1", components: 1, counts: { E: 1 }, largest: {} }),
    });
    const res = await addSampleApi(request, { params: Promise.resolve({ runId: openRunId }) });
    expect(res.status).toBe(503);
    expect(JSON.stringify(await res.json())).toMatch(/read-only/);
  });

  it("answers a write through a form with the same sentence, not a generic failure", async () => {
    setSessionCookie(SESSION_COOKIE, sessionToken);
    const form = new FormData();
    form.set("runId", verifiedRunId);
    form.set("reason", "Correct the blank value");
    const result = await reviseRunAction(null, form);
    expect(result).toMatchObject({ ok: false, message: expect.stringMatching(/read-only/) });
  });
});
