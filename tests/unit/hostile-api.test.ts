import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as auditEventsRoute from "@/app/api/v1/audit-events/route";
import * as changeRequestRoute from "@/app/api/v1/change-requests/[changeRequestId]/route";
import * as changeRequestsRoute from "@/app/api/v1/change-requests/route";
import * as systemsRoute from "@/app/api/v1/cleaning-systems/route";
import * as recipeRoute from "@/app/api/v1/recipes/[recipeId]/route";
import * as recipeVersionRoute from "@/app/api/v1/recipes/[recipeId]/versions/[version]/route";
import * as recipesRoute from "@/app/api/v1/recipes/route";
import * as samplesRoute from "@/app/api/v1/test-runs/[runId]/samples/route";
import * as testRunRoute from "@/app/api/v1/test-runs/[runId]/route";
import * as testRunsRoute from "@/app/api/v1/test-runs/route";
import {
  auditEvents,
  partFamilies,
  recipes,
  recipeVersions,
  testSamples,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { queryAuditEvents } from "@/lib/server/audit/query-audit-events";
import { createRun } from "@/lib/server/evidence/create-run";
import { listRunsPage } from "@/lib/server/evidence/queries";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let auditor = "";
let tech = "";
let runId = "";
let recipeId = "";
const BASE = "http://127.0.0.1/api/v1";
const UNKNOWN = "00000000-0000-4000-8000-000000000000";
/** SQL metacharacters and LIKE wildcards a search must treat as text. */
const SQL = [
  "' OR 1=1 --",
  "%",
  "_",
  '"',
  ";",
  "\\",
  "'; drop table audit_events; --",
  "%' OR '%'='",
];

type Handler = (
  request: Request,
  route: { params: Promise<Record<string, string>> },
) => Promise<Response>;
const call = (
  handler: unknown,
  path: string,
  token: string,
  params: Record<string, string> = {},
  init: RequestInit = {},
) =>
  (handler as Handler)(
    new Request(`${BASE}${path}`, {
      ...init,
      headers: { authorization: `Bearer ${token}`, ...(init.headers ?? {}) },
    }),
    { params: Promise.resolve(params) },
  );

/** What the body may not carry: stack frames, database or SQL text. */
async function plain(res: Response) {
  const text = await res.text();
  expect(text).not.toMatch(
    /\n\s+at |SQLITE|Libsql|drizzle|\bselect\b.+\bfrom\b|\binsert into\b|Error:/i,
  );
  return JSON.parse(text) as {
    error?: string;
    fieldErrors?: Record<string, string[]>;
    data?: unknown[];
  };
}

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  const person = async (role: string) =>
    (
      await t.db
        .select({ id: users.id, name: users.name })
        .from(users)
        .where(eq(users.email, `${role}@fennmoor.example`))
    )[0];
  const [a, tc] = [await person("auditor"), await person("technician")];
  auditor = (await createApiToken(a, { name: "Auditor", scope: "read" })).token;
  tech = (await createApiToken(tc, { name: "Counter", scope: "read_write" })).token;
  const [family] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  const [version] = await t.db
    .select({ id: recipeVersions.id, recipeId: recipes.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  recipeId = version.recipeId;
  runId = (
    await createRun(tc, {
      partFamilyId: family.id,
      recipeVersionId: version.id,
      testType: "gravimetric",
      technicianId: tc.id,
      lab: "Larchfield lab",
      performedOn: "2026-11-20",
    } as never)
  ).id;
});
afterAll(() => t.cleanup());

describe("SQL metacharacters in filters", () => {
  it("audit-trail filters in the API match text exactly and never widen: every hostile value finds nothing", async () => {
    for (const value of SQL) {
      for (const field of ["actor", "recordType", "recordId", "eventType"]) {
        const res = await call(
          auditEventsRoute.GET,
          `/audit-events?${field}=${encodeURIComponent(value)}`,
          auditor,
        );
        expect(res.status, `${field}=${value}`).toBe(200);
        expect((await plain(res)).data, `${field}=${value}`).toEqual([]);
      }
    }
  });

  it("a real filter still finds exactly the rows it names", async () => {
    const [{ n }] = await t.db
      .select({ n: sql<number>`count(*)` })
      .from(auditEvents)
      .where(eq(auditEvents.action, "user.created"));
    expect(n).toBeGreaterThan(0);
    const res = await call(
      auditEventsRoute.GET,
      "/audit-events?eventType=user.created&limit=200",
      auditor,
    );
    expect((await plain(res)).data).toHaveLength(n);
  });

  it("the audit browser's service matches % and _ literally", async () => {
    // [derived] "user_created" differs from "user.created" only where _ would be a LIKE wildcard.
    expect(
      (await queryAuditEvents(auditQuerySchema.parse({ eventType: "user_created" }))).items,
    ).toEqual([]);
    expect((await queryAuditEvents(auditQuerySchema.parse({ eventType: "user.%" }))).items).toEqual(
      [],
    );
  });

  it("closed filters and sort columns refuse hostile values with 400 naming the field", async () => {
    const closed: [unknown, string, string][] = [
      [recipesRoute.GET, "/recipes?systemId=", "systemId"],
      [recipesRoute.GET, "/recipes?cursor=", "cursor"],
      [changeRequestsRoute.GET, "/change-requests?status=", "status"],
      [changeRequestsRoute.GET, "/change-requests?recipeId=", "recipeId"],
      [testRunsRoute.GET, "/test-runs?testType=", "testType"],
      [testRunsRoute.GET, "/test-runs?partFamilyId=", "partFamilyId"],
      [systemsRoute.GET, "/cleaning-systems?limit=", "limit"],
    ];
    for (const value of SQL) {
      for (const [handler, path, field] of closed) {
        const res = await call(handler, path + encodeURIComponent(value), auditor);
        expect(res.status, path + value).toBe(400);
        expect(Object.keys((await plain(res)).fieldErrors ?? {}), path + value).toContain(field);
      }
      for (const field of ["sort", "dir", "testType", "outcome", "partFamilyId", "from", "page"]) {
        expect(
          evidenceListQuerySchema.safeParse({ [field]: value }).success,
          `${field}=${value}`,
        ).toBe(false);
      }
    }
    // The evidence list's sort is a closed set; the default still lists the plant's runs.
    expect((await listRunsPage(evidenceListQuerySchema.parse({}))).total).toBeGreaterThan(0);
  });
});

describe("no server insides in API answers", () => {
  it("bad and unknown ids in the path get 404 with a plain message", async () => {
    for (const id of ["not-a-uuid", "' OR 1=1 --", UNKNOWN]) {
      for (const [handler, path, params] of [
        [changeRequestRoute.GET, `/change-requests/${id}`, { changeRequestId: id }],
        [recipeRoute.GET, `/recipes/${id}`, { recipeId: id }],
        [testRunRoute.GET, `/test-runs/${id}`, { runId: id }],
        [recipeVersionRoute.GET, `/recipes/${id}/versions/1`, { recipeId: id, version: "1" }],
      ] as const) {
        const res = await call(handler, encodeURI(path), auditor, params);
        expect(res.status, path).toBe(404);
        expect((await plain(res)).error).toMatch(/^No .+ with that id\.$|^No /);
      }
    }
    for (const version of ["0", "-1", "1e309", "x", "1;drop"]) {
      const res = await call(
        recipeVersionRoute.GET,
        `/recipes/${recipeId}/versions/${version}`,
        auditor,
        { recipeId, version },
      );
      expect(res.status, version).toBeGreaterThanOrEqual(400);
      expect(res.status, version).toBeLessThan(500);
      await plain(res);
    }
  });

  it("broken and hostile result bodies are refused with a message and write nothing", async () => {
    const bodies = [
      "{",
      "null",
      "[]",
      '"text"',
      "1e309",
      '{"sampleLabel":{"$gt":""}}',
      `{"sampleLabel":"${"x".repeat(100)}"}`,
      JSON.stringify({ sampleLabel: "S1", __proto__: { admin: true } }),
      "[".repeat(5000) + "]".repeat(5000),
    ];
    for (const body of bodies) {
      const res = await call(
        samplesRoute.POST,
        `/test-runs/${runId}/samples`,
        tech,
        { runId },
        { method: "POST", body, headers: { "content-type": "application/json" } },
      );
      expect(res.status, body.slice(0, 40)).toBeGreaterThanOrEqual(400);
      expect(res.status, body.slice(0, 40)).toBeLessThan(500);
      await plain(res);
    }
    expect(await t.db.select().from(testSamples).where(eq(testSamples.runId, runId))).toEqual([]);
  });
});
