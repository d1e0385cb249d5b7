import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it, vi, type MockInstance } from "vitest";
import { seedDemo } from "@/db/seed";
import { ENDPOINTS } from "@/lib/auth/endpoints";
import { PERMISSIONS, type Role } from "@/lib/auth/permissions";
import { CLASS_KEYS } from "@/lib/schemas/evidence";
import {
  actAs,
  changedTables,
  describeOutcome,
  discoverEndpoints,
  invoke,
  peopleByRole,
  routeRequest,
  tableCounts,
  type Endpoint,
  type Outcome,
} from "./support/endpoints";
import {
  auditSeq,
  badMessage,
  hostileForm,
  hostileJson,
  hostileText,
  realIds,
  toFormData,
  vocabulary,
  writesOnRefusal,
} from "./support/hostile";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

// [practice] enough runs per endpoint to cross each schema's branches; both suites stay near a minute on two busy cores.
// HOSTILE_RUNS=500 searches deeper; HOSTILE_SEED=<seed from a failure> replays one.
const ACTION_RUNS = Number(process.env.HOSTILE_RUNS ?? 30);
const ROUTE_RUNS = Number(process.env.HOSTILE_RUNS ?? 60);
// A run that hashes a password (argon2) takes a while; a timed-out property would go on writing under the next test.
// Generous: some actions do real work per run (the integrity check re-hashes the whole trail), and CI machines are shared.
const timeout = (runs: number) => Math.max(60_000, runs * 2_000);
const seed = process.env.HOSTILE_SEED ? { seed: Number(process.env.HOSTILE_SEED) } : {};

const all = await discoverEndpoints();
// Endpoints that take a body: actions with an argument, route handlers other than GET.
const actions = all.filter((e) => e.kind === "action" && e.fn.length > 0);
const routes = all.filter((e) => e.kind === "route" && e.method !== "GET");

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;
let ids: Record<string, string[]> = {};
let runIds: string[] = [];
let logged: MockInstance<typeof console.error>;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  ids = await realIds(t.client);
  runIds = (await t.client.execute("SELECT id FROM test_runs")).rows.map((r) => String(r.id));
  logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
});
afterAll(() => {
  logged.mockRestore();
  t.cleanup();
});

/** A role the registry allows to call this endpoint (null: public), so the body itself is what is tested. */
function allowedRole(e: Endpoint): Role | null {
  const rule = ENDPOINTS[e.key];
  return rule.auth === "public" ? null : (PERMISSIONS[rule.permission][0] as Role);
}

/** The one rule for every hostile call: a clear refusal that wrote nothing, or a success that was audited. */
async function judge(outcome: Outcome, before: { counts: Record<string, number>; seq: number }) {
  const label = describeOutcome(outcome);
  expect(outcome.kind, label).not.toBe("threw");
  expect(outcome.kind, label).not.toBe("forbidden");
  expect(
    logged.mock.calls.map((c) => String(c[0] instanceof Error ? c[0].stack : c[0])),
    `logged an error: ${label}`,
  ).toEqual([]);
  let refusedWith: unknown;
  let succeeded = outcome.kind === "redirect";
  if (outcome.kind === "result") {
    if (outcome.value.ok === false) refusedWith = outcome.value.message;
    else succeeded = outcome.value.ok === true;
    expect(
      succeeded || outcome.value.ok === false,
      `neither a success nor a refusal: ${label}`,
    ).toBe(true);
  }
  if (outcome.kind === "response") {
    expect(outcome.status, label).toBeLessThan(500);
    succeeded = outcome.status < 300;
    if (!succeeded) {
      expect(outcome.status, label).toBeGreaterThanOrEqual(400);
      expect(outcome.contentType, label).toMatch(/application\/json/);
      const body = JSON.parse(outcome.body) as { error?: unknown; message?: unknown };
      refusedWith = body.error ?? body.message;
    }
  }
  const after = await tableCounts(t.client);
  if (succeeded) {
    expect(await auditSeq(t.client), `succeeded without an audit event: ${label}`).toBeGreaterThan(
      before.seq,
    );
  } else {
    expect(badMessage(refusedWith), label).toBeNull();
    expect(
      await writesOnRefusal(t.client, changedTables(before.counts, after), before.seq),
      `refused but wrote: ${label}`,
    ).toEqual([]);
  }
}

/**
 * Generated bodies that happen to be valid may reset a password, deactivate someone or take a
 * role away; each call starts with the demo people able to act again, so later calls still test
 * the body and not a locked-out caller.
 */
async function restorePeople() {
  await t.client.execute(
    "UPDATE users SET must_change_password = 0, active = 1, locked_until = NULL, failed_attempts = 0",
  );
  await t.client.execute("UPDATE api_tokens SET revoked_at = NULL");
  for (const [role, person] of Object.entries(people)) {
    await t.client.execute({
      sql: "INSERT OR IGNORE INTO user_roles (user_id, role) VALUES (?, ?)",
      args: [person.id, role],
    });
  }
}

async function snapshot() {
  await restorePeople();
  logged.mockClear();
  return { counts: await tableCounts(t.client), seq: await auditSeq(t.client) };
}

describe("server actions given hostile form data answer with a clear refusal or an audited success", () => {
  it.each(actions.map((e) => [e.key, e] as const))(
    "%s",
    async (_key, e) => {
      const { keys, words } = vocabulary(e.file);
      const role = allowedRole(e);
      // The autosave takes a plain object from the editor; every other action a form.
      const input: fc.Arbitrary<unknown> =
        e.fn.length === 1 ? hostileJson(keys, words, ids) : hostileForm(keys, words, ids);
      await fc.assert(
        fc.asyncProperty(input, async (value) => {
          await actAs(role ? people[role] : null);
          const before = await snapshot();
          const outcome = await invoke(() =>
            e.fn.length === 1
              ? e.fn(value)
              : e.fn(null, toFormData(value as [string, string | File][])),
          );
          await judge(outcome, before);
        }),
        { numRuns: ACTION_RUNS, ...seed },
      );
    },
    timeout(ACTION_RUNS),
  );
});

describe("API routes given hostile bodies answer 4xx with a message, or an audited success", () => {
  const contentTypes = [
    "application/json",
    "application/json; charset=utf-8",
    "APPLICATION/JSON",
    "text/plain",
    "text/csv",
    "application/x-www-form-urlencoded",
    "multipart/form-data",
    "multipart/form-data; boundary=x",
    "",
    "application/xml",
  ];

  it.each(routes.map((e) => [e.key, e] as const))(
    "%s",
    async (_key, e) => {
      const { keys, words } = vocabulary(e.file);
      const text = hostileText(words, ids);
      const runId = fc.oneof(fc.constantFrom(...runIds), fc.uuid().map(String), text);
      const rawBody = fc.record({
        type: fc.constantFrom(...contentTypes),
        body: fc.oneof(
          hostileJson(keys, words, ids).map((v) => JSON.stringify(v) ?? ""),
          fc.string({ maxLength: 60 }),
          fc
            .integer({ min: 1, max: 4 })
            .map((n) => JSON.stringify({ sampleLabel: "x".repeat(n * 500_000), counts: { B: n } })),
          fc.constantFrom(
            "{",
            "[1,",
            '{"a":}',
            "null",
            "\uFEFF{}",
            "--x\r\nContent-Disposition: form-data\r\n\r\n",
          ),
        ),
      });
      // A CSV whose header mixes the importer's columns with anything, and whose cells are anything.
      const csv = fc
        .tuple(
          fc.array(fc.constantFrom(...keys, ...CLASS_KEYS, "sample", "components"), {
            minLength: 1,
            maxLength: 6,
          }),
          fc.array(fc.array(text, { maxLength: 6 }), { maxLength: 5 }),
          fc.constantFrom("counts.csv", "x.xlsx", "", "../../etc/passwd"),
        )
        .map(
          ([header, rows, name]) =>
            new File([[header, ...rows].map((r) => r.join(",")).join("\r\n")], name || "upload"),
        );
      const multipart = fc
        .tuple(
          hostileForm([...keys, "file", "kind", "sampleLabel", "mapping"], words, ids),
          fc.option(csv),
        )
        .map(([entries, file]) => {
          const form = toFormData(entries);
          if (file) form.set("file", file);
          return form;
        });
      const isApi = ENDPOINTS[e.key].auth === "token";
      const role = allowedRole(e)!;
      await fc.assert(
        fc.asyncProperty(runId, fc.oneof(rawBody, multipart), async (id, sent) => {
          await actAs(isApi ? null : people[role]);
          const headers: Record<string, string> = isApi
            ? { authorization: `Bearer ${people[role].writeToken}` }
            : {};
          if (!(sent instanceof FormData) && sent.type) headers["content-type"] = sent.type;
          const { request, context } = routeRequest(e, {
            headers,
            body: sent instanceof FormData ? sent : sent.body,
            params: { runId: id },
          });
          const before = await snapshot();
          await judge(await invoke(() => e.fn(request, context)), before);
        }),
        { numRuns: ROUTE_RUNS, ...seed },
      );
    },
    timeout(ROUTE_RUNS),
  );
});
