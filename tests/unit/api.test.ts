import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as auditEventsRoute from "@/app/api/v1/audit-events/route";
import * as changeRequestRoute from "@/app/api/v1/change-requests/[changeRequestId]/route";
import * as recipesRoute from "@/app/api/v1/recipes/route";
import * as recipeVersionRoute from "@/app/api/v1/recipes/[recipeId]/versions/[version]/route";
import * as samplesRoute from "@/app/api/v1/test-runs/[runId]/samples/route";
import * as openapiRoute from "@/app/api/v1/openapi.json/route";
import * as systemsRoute from "@/app/api/v1/cleaning-systems/route";
import * as partFamiliesRoute from "@/app/api/v1/part-families/route";
import * as specificationsRoute from "@/app/api/v1/specifications/route";
import * as combinationsRoute from "@/app/api/v1/qualified-combinations/route";
import {
  apiTokens,
  auditEvents,
  changeRequests,
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testSamples,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { generateApiToken, hashApiToken } from "@/lib/auth/api-token";
import {
  auditEventPage,
  changeRequestDetailOut,
  cleaningSystemPage,
  partFamilyPage,
  qualifiedCombinationPage,
  recipePage,
  recipeVersionOut,
  sampleAddedOut,
  specificationPage,
} from "@/lib/schemas/api";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { revokeApiToken } from "@/lib/server/api-tokens/revoke-api-token";
import { authenticateApi } from "@/lib/server/api/authenticate";
import { resetPassword } from "@/lib/server/users/reset-password";
import { setUserActive } from "@/lib/server/users/set-user-active";
import { createRun } from "@/lib/server/evidence/create-run";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};
const tokens: Record<string, string> = {};
let runId = "";

const BASE = "http://127.0.0.1/api/v1";
const noParams = { params: Promise.resolve({}) };
const get = (path: string, token?: string) =>
  new Request(`${BASE}${path}`, { headers: token ? { authorization: `Bearer ${token}` } : {} });
const post = (path: string, token: string | undefined, body: string, type = "application/json") =>
  new Request(`${BASE}${path}`, {
    method: "POST",
    headers: { ...(token ? { authorization: `Bearer ${token}` } : {}), "content-type": type },
    body,
  });
const postResult = (token: string | undefined, body: unknown, id = runId) =>
  samplesRoute.POST(
    post(`/test-runs/${id}/samples`, token, typeof body === "string" ? body : JSON.stringify(body)),
    { params: Promise.resolve({ runId: id }) },
  );
const count = async () =>
  (await t.db.select().from(testSamples).where(eq(testSamples.runId, runId))).length;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "technician", "auditor", "approver"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
  tokens.techWrite = (
    await createApiToken(people.technician, { name: "Counter", scope: "read_write" })
  ).token;
  tokens.techRead = (
    await createApiToken(people.technician, { name: "Dashboard", scope: "read" })
  ).token;
  tokens.auditorWrite = (
    await createApiToken(people.auditor, { name: "Auditor script", scope: "read_write" })
  ).token;
  tokens.auditorRead = (
    await createApiToken(people.auditor, { name: "Auditor read", scope: "read" })
  ).token;
  const revoked = await createApiToken(people.engineer, { name: "Old", scope: "read_write" });
  await revokeApiToken(people.engineer, { tokenId: revoked.id });
  tokens.revoked = revoked.token;
  const [family] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  const [version] = await t.db
    .select({ id: recipeVersions.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  const run = await createRun(people.technician, {
    partFamilyId: family.id,
    recipeVersionId: version.id,
    testType: "gravimetric",
    technicianId: people.technician.id,
    lab: "Larchfield lab",
    performedOn: "2026-11-20",
  } as never);
  runId = run.id;
});
afterAll(() => t.cleanup());

describe("API tokens", () => {
  it("stores only the SHA-256 and a short prefix, never the token", async () => {
    const rows = await t.db
      .select()
      .from(apiTokens)
      .where(eq(apiTokens.userId, people.technician.id));
    const row = rows.find((r) => r.name === "Counter")!;
    expect(row.tokenHash).toBe(hashApiToken(tokens.techWrite));
    expect(tokens.techWrite.startsWith(row.prefix)).toBe(true);
    expect(row.prefix.length).toBeLessThan(16);
    expect(JSON.stringify(rows)).not.toContain(tokens.techWrite);
    const a = generateApiToken();
    const b = generateApiToken();
    expect(a.token).not.toBe(b.token);
    expect(a.token.length).toBeGreaterThan(40);
  });

  it("a revoked token is refused, and revoking twice or someone else's token is refused", async () => {
    const res = await recipesRoute.GET(get("/recipes", tokens.revoked), noParams);
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/revoked/);
    const [row] = await t.db
      .select()
      .from(apiTokens)
      .where(eq(apiTokens.tokenHash, hashApiToken(tokens.revoked)));
    await expect(revokeApiToken(people.engineer, { tokenId: row.id })).rejects.toThrow(
      /already revoked/,
    );
    const [other] = await t.db
      .select()
      .from(apiTokens)
      .where(eq(apiTokens.tokenHash, hashApiToken(tokens.techRead)));
    await expect(revokeApiToken(people.engineer, { tokenId: other.id })).rejects.toThrow(
      /does not exist/,
    );
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, row.id));
    expect(events.map((e) => e.action)).toEqual(["api_token.created", "api_token.revoked"]);
  });

  it("missing and unknown tokens get 401 with a message, and a use is recorded as last used", async () => {
    for (const token of [undefined, "wpk_not-a-real-token-at-all-000000000000000"]) {
      const res = await recipesRoute.GET(get("/recipes", token), noParams);
      expect(res.status).toBe(401);
      expect((await res.json()).error).toMatch(/token/i);
    }
    await recipesRoute.GET(get("/recipes", tokens.techRead), noParams);
    const [row] = await t.db
      .select()
      .from(apiTokens)
      .where(eq(apiTokens.tokenHash, hashApiToken(tokens.techRead)));
    expect(row.lastUsedAt).not.toBeNull();
  });
});

describe("reading", () => {
  it("pages recipes with a cursor until the end, every page matching its schema", async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const res = await recipesRoute.GET(
        get(`/recipes?limit=1${cursor ? `&cursor=${cursor}` : ""}`, tokens.auditorRead),
        noParams,
      );
      expect(res.status).toBe(200);
      const body = recipePage.parse(await res.json());
      seen.push(...body.data.map((r) => r.code));
      cursor = body.nextCursor;
    } while (cursor);
    expect(seen).toEqual(["R-AW3-BC", "R-AW3-PH", "R-AW3-VB", "R-SC1-SF"]);
  });

  it("refuses unknown query parameters, wrong types and forged cursors with 400 naming the field", async () => {
    for (const [query, field] of [
      ["?colour=teal", "_"],
      ["?limit=many", "limit"],
      ["?limit=0", "limit"],
      ["?cursor=not-ours", "cursor"],
    ]) {
      const res = await recipesRoute.GET(get(`/recipes${query}`, tokens.auditorRead), noParams);
      expect(res.status, query).toBe(400);
      expect(Object.keys((await res.json()).fieldErrors ?? {}), query).toContain(field);
    }
  });

  it("answers a change request with its diff, signatures and evidence, a recipe version with its parameters, and 404 for what does not exist", async () => {
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.number, "CR-2026-001"));
    const res = await changeRequestRoute.GET(get(`/change-requests/${cr.id}`, tokens.auditorRead), {
      params: Promise.resolve({ changeRequestId: cr.id }),
    });
    const body = changeRequestDetailOut.parse(await res.json());
    expect(
      body.parameterChanges.map((p) => [p.key, p.old?.setpoint, p.new?.setpoint, p.position]),
    ).toEqual([["drying.temperature", 90, 105, "outside"]]);
    expect(body.signatures.map((s) => s.meaning)).toEqual(["authored", "approved", "verified"]);
    expect(body.evidenceRunIds.length).toBeGreaterThan(0);
    const [sf] = await t.db.select().from(recipes).where(eq(recipes.code, "R-SC1-SF"));
    const v = recipeVersionOut.parse(
      await (
        await recipeVersionRoute.GET(get(`/recipes/${sf.id}/versions/2`, tokens.techRead), {
          params: Promise.resolve({ recipeId: sf.id, version: "2" }),
        })
      ).json(),
    );
    expect(
      v.stages.flatMap((s) => s.parameters).find((p) => p.key === "drying.temperature"),
    ).toMatchObject({ setpoint: 105, validatedLow: 95, validatedHigh: 110, unit: "°C" });
    expect(
      (
        await recipeVersionRoute.GET(get(`/recipes/${sf.id}/versions/9`, tokens.techRead), {
          params: Promise.resolve({ recipeId: sf.id, version: "9" }),
        })
      ).status,
    ).toBe(404);
    expect(
      (
        await changeRequestRoute.GET(get("/change-requests/nope", tokens.auditorRead), {
          params: Promise.resolve({ changeRequestId: "nope" }),
        })
      ).status,
    ).toBe(404);
  });

  it("applies the role table: the audit trail is for auditors, not technicians", async () => {
    expect(
      (await auditEventsRoute.GET(get("/audit-events?limit=5", tokens.techRead), noParams)).status,
    ).toBe(403);
    const res = await auditEventsRoute.GET(
      get("/audit-events?limit=5&eventType=change.closed", tokens.auditorRead),
      noParams,
    );
    const page = auditEventPage.parse(await res.json());
    expect(page.data.every((e) => e.eventType === "change.closed")).toBe(true);
  });

  it("publishes an OpenAPI 3.1 document whose every path answers in this API", async () => {
    const doc = await openapiRoute.GET().json();
    expect(doc.openapi).toBe("3.1.0");
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining([
        "/recipes",
        "/change-requests/{changeRequestId}",
        "/test-runs/{runId}/samples",
        "/audit-events",
      ]),
    );
    expect(doc.paths["/recipes"].get.parameters.map((p: { name: string }) => p.name)).toEqual([
      "limit",
      "cursor",
      "systemId",
    ]);
    expect(doc.components.schemas.ChangeRequestDetail.properties.signatures).toBeDefined();
    expect(doc.components.schemas.RecipePage.properties.data.items.$ref).toBe(
      "#/components/schemas/Recipe",
    );
  });
});

describe("plant master data", () => {
  it("answers cleaning systems with asset number, retirement and each stage's equipment, in process order", async () => {
    const body = cleaningSystemPage.parse(
      await (await systemsRoute.GET(get("/cleaning-systems", tokens.techRead), noParams)).json(),
    );
    for (const s of body.data)
      expect(s.stages.map((st) => st.position)).toEqual(s.stages.map((_, i) => i + 1));
    const aw3 = body.data.find((s) => s.code === "AW-3")!;
    expect(aw3).toHaveProperty("assetNumber");
    expect(aw3.retiredAt).toBeNull();
    expect(aw3.stages[0]).toHaveProperty("filterRatingUm");
    const recipesBody = recipePage.parse(
      await (await recipesRoute.GET(get("/recipes", tokens.techRead), noParams)).json(),
    );
    expect(recipesBody.data.every((r) => r.systemRetired === false)).toBe(true);
  });

  it("pages part families to the end, each naming the specification revision in force, and filters by specification", async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const res = await partFamiliesRoute.GET(
        get(`/part-families?limit=1${cursor ? `&cursor=${cursor}` : ""}`, tokens.techRead),
        noParams,
      );
      expect(res.status).toBe(200);
      const body = partFamilyPage.parse(await res.json());
      seen.push(...body.data.map((f) => f.code));
      cursor = body.nextCursor;
    } while (cursor);
    const stored = await t.db.select({ code: partFamilies.code }).from(partFamilies);
    expect(seen).toEqual(stored.map((f) => f.code).sort());
    const [vb] = await t.db
      .select({ f: partFamilies, spec: cleanlinessSpecs })
      .from(partFamilies)
      .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
      .where(eq(partFamilies.code, "PF-VB-210"));
    const filtered = partFamilyPage.parse(
      await (
        await partFamiliesRoute.GET(
          get(`/part-families?specCode=${encodeURIComponent(vb.spec.code)}`, tokens.techRead),
          noParams,
        )
      ).json(),
    );
    expect(filtered.data.map((f) => f.code)).toContain("PF-VB-210");
    expect(filtered.data.every((f) => f.specCode === vb.spec.code)).toBe(true);
    expect(filtered.data.find((f) => f.code === "PF-VB-210")).toMatchObject({
      specId: vb.spec.id,
      specRevision: vb.spec.revision,
      wettedAreaCm2: vb.f.wettedAreaCm2,
    });
    expect(
      (await partFamiliesRoute.GET(get("/part-families?spec=x", tokens.techRead), noParams)).status,
    ).toBe(400);
  });

  it("answers specification revisions with their limits, filtered by status", async () => {
    const all = specificationPage.parse(
      await (
        await specificationsRoute.GET(
          get("/specifications?limit=200", tokens.auditorRead),
          noParams,
        )
      ).json(),
    );
    const stored = await t.db.select().from(cleanlinessSpecs);
    expect(all.data).toHaveLength(stored.length);
    const one = stored[0];
    expect(all.data.find((s) => s.id === one.id)).toMatchObject({
      code: one.code,
      revision: one.revision,
      ccc: one.ccc,
      gravimetricLimitMg: one.gravimetricLimitMg,
      customerApprovesChanges: one.customerApprovesChanges,
    });
    const inForce = specificationPage.parse(
      await (
        await specificationsRoute.GET(
          get("/specifications?status=in_force", tokens.auditorRead),
          noParams,
        )
      ).json(),
    );
    expect(inForce.data.length).toBe(stored.filter((s) => s.status === "in_force").length);
    expect(
      (
        await specificationsRoute.GET(
          get("/specifications?status=draft", tokens.auditorRead),
          noParams,
        )
      ).status,
    ).toBe(400);
  });

  it("answers qualified combinations with their recipe version, part family and requalification due date", async () => {
    const stored = await t.db.select().from(requalificationIntervals);
    expect(stored.length).toBeGreaterThan(0);
    const body = qualifiedCombinationPage.parse(
      await (
        await combinationsRoute.GET(
          get("/qualified-combinations?limit=200", tokens.techRead),
          noParams,
        )
      ).json(),
    );
    expect(body.data.map((c) => c.id).sort()).toEqual(stored.map((c) => c.id).sort());
    const [family] = await t.db
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.code, "PF-VB-210"));
    const forFamily = qualifiedCombinationPage.parse(
      await (
        await combinationsRoute.GET(
          get(`/qualified-combinations?partFamilyId=${family.id}`, tokens.techRead),
          noParams,
        )
      ).json(),
    );
    expect(forFamily.data.length).toBeGreaterThan(0);
    expect(forFamily.data.every((c) => c.partFamilyCode === "PF-VB-210")).toBe(true);
    const vb = forFamily.data.find((c) => c.recipeCode === "R-AW3-VB")!;
    // A 12-month interval from its last qualification (the demo's interval): the due date is a calendar date a year on.
    const interval = stored.find((s) => s.id === vb.id)!;
    expect(vb.dueOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(Number(vb.dueOn.slice(0, 4)) * 12 + Number(vb.dueOn.slice(5, 7))).toBe(
      Number(interval.lastQualifiedAt.slice(0, 4)) * 12 +
        Number(interval.lastQualifiedAt.slice(5, 7)) +
        interval.intervalMonths,
    );
    expect(
      (
        await combinationsRoute.GET(
          get("/qualified-combinations?partFamilyId=nope", tokens.techRead),
          noParams,
        )
      ).status,
    ).toBe(400);
    expect((await combinationsRoute.GET(get("/qualified-combinations"), noParams)).status).toBe(
      401,
    );
  });

  it("lists the master-data paths in the OpenAPI description", async () => {
    const doc = await openapiRoute.GET().json();
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining(["/part-families", "/specifications", "/qualified-combinations"]),
    );
    expect(
      doc.paths["/qualified-combinations"].get.parameters.map((p: { name: string }) => p.name),
    ).toEqual(["limit", "cursor", "partFamilyId", "recipeId"]);
    expect(doc.components.schemas.QualifiedCombinationPage.properties.data.items.$ref).toBe(
      "#/components/schemas/QualifiedCombination",
    );
  });
});

describe("posting lab results", () => {
  const good = {
    sampleLabel: "VB-26-001",
    worstCase: true,
    components: 5,
    filterBeforeMg: 100.2,
    filterAfterMg: 100.9,
  };

  it("refuses bad input with clear errors and writes nothing", async () => {
    const cases: [string | undefined, unknown, number, RegExp | string][] = [
      [tokens.techWrite, "{not json", 400, /not valid JSON/],
      [tokens.techWrite, { ...good, colour: "teal" }, 422, "colour"],
      // A mis-cased key is refused by name, never dropped (the sample would be stored without it).
      [tokens.techWrite, { ...good, FilterAfterMg: 101 }, 422, "FilterAfterMg"],
      // Over the 1 MB body limit: 413 saying the limit, not "not valid JSON".
      [tokens.techWrite, { ...good, sampleLabel: "x".repeat(1024 * 1024 + 1) }, 413, /1 MB limit/],
      [tokens.techWrite, { ...good, components: "five" }, 422, "components"],
      [tokens.techWrite, { worstCase: false }, 422, "sampleLabel"],
      [tokens.techWrite, [good], 422, /not valid/],
      [undefined, good, 401, /token/],
      [tokens.revoked, good, 401, /revoked/],
      [tokens.techRead, good, 403, /read-only/],
      [tokens.auditorWrite, good, 403, /role/],
      [tokens.auditorRead, good, 403, /read-only/],
    ];
    for (const [token, body, status, expected] of cases) {
      const res = await postResult(token, body);
      const json = await res.json();
      expect(res.status, JSON.stringify(body)).toBe(status);
      if (typeof expected === "string")
        expect(Object.keys(json.fieldErrors ?? {})).toContain(expected);
      else expect(json.error).toMatch(expected);
    }
    const bad = await samplesRoute.POST(
      post(
        `/test-runs/${runId}/samples`,
        tokens.techWrite,
        "sampleLabel=x",
        "application/x-www-form-urlencoded",
      ),
      { params: Promise.resolve({ runId }) },
    );
    expect(bad.status).toBe(415);
    const missing = "00000000-0000-4000-8000-000000000000";
    expect((await postResult(tokens.techWrite, good, missing)).status).toBe(404);
    expect(await count()).toBe(0);
  });

  it("records a sample through the evidence service, recomputes the outcome, audits it under the token's owner naming the token, and refuses a duplicate with 409", async () => {
    const res = await postResult(tokens.techWrite, good);
    expect(res.status).toBe(201);
    const body = sampleAddedOut.parse(await res.json());
    expect(body.run.samples.map((r) => r.sampleLabel)).toEqual(["VB-26-001"]);
    expect(body.run.outcome).not.toBeNull();
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordId, runId), eq(auditEvents.action, "test_run.sample_added")));
    const [token] = await t.db
      .select()
      .from(apiTokens)
      .where(eq(apiTokens.tokenHash, hashApiToken(tokens.techWrite)));
    expect(event.actorId).toBe(people.technician.id);
    expect(event.actorName).toBe(`${people.technician.name} (API token ${token.id})`);
    const dup = await postResult(tokens.techWrite, good);
    expect(dup.status).toBe(409);
    expect((await dup.json()).error).toMatch(/already recorded/);
    expect(await count()).toBe(1);
  });
});

describe("token lifetime and suspension", () => {
  const bearer = (token: string) =>
    new Request(`${BASE}/recipes`, { headers: { authorization: `Bearer ${token}` } });

  it("expires after 90 days by default, or after the lifetime chosen at creation", async () => {
    const made = new Date("2026-05-01T12:00:00.000Z");
    const standard = await createApiToken(
      people.engineer,
      { name: "Default lifetime", scope: "read" },
      made,
    );
    const short = await createApiToken(
      people.engineer,
      { name: "Short", scope: "read", expiresInDays: 30 },
      made,
    );
    expect(standard.expiresAt).toBe("2026-07-30T12:00:00.000Z");
    expect(short.expiresAt).toBe("2026-05-31T12:00:00.000Z");
    const day29 = new Date("2026-05-30T12:00:00.000Z");
    const day31 = new Date("2026-06-01T12:00:00.000Z");
    expect((await authenticateApi(bearer(short.token), "trace.view", "read", day29)).ok).toBe(true);
    expect(await authenticateApi(bearer(short.token), "trace.view", "read", day31)).toEqual({
      ok: false,
      status: 401,
      message: "This API token expired on 2026-05-31. Create a new one.",
    });
    expect((await authenticateApi(bearer(standard.token), "trace.view", "read", day31)).ok).toBe(
      true,
    );
    expect(
      (
        await authenticateApi(
          bearer(standard.token),
          "trace.view",
          "read",
          new Date("2026-07-30T12:00:00.000Z"),
        )
      ).ok,
    ).toBe(false);
  });

  it("refuses a lifetime that is not offered", async () => {
    const { createApiTokenSchema } = await import("@/lib/schemas/api-token");
    expect(
      createApiTokenSchema.safeParse({ name: "x", scope: "read", expiresInDays: "3650" }).success,
    ).toBe(false);
    expect(createApiTokenSchema.parse({ name: "x", scope: "read" }).expiresInDays).toBe(90);
  });

  it("is suspended by a password reset of its owner, for good, and the reset's audit event names it", async () => {
    const [u] = await t.db.select().from(users).where(eq(users.email, "approver@fennmoor.example"));
    const made = await createApiToken(people.approver, { name: "Approver script", scope: "read" });
    expect((await recipesRoute.GET(get("/recipes", made.token), noParams)).status).toBe(200);
    const { temporaryPassword } = await resetPassword(
      { id: null, name: "test admin" },
      { userId: u.id },
    );
    const res = await recipesRoute.GET(get("/recipes", made.token), noParams);
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(
      /^This API token was suspended on \d{4}-\d{2}-\d{2} because the owner's password was reset\. Create a new one\.$/,
    );
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordId, u.id), eq(auditEvents.action, "user.password_reset")));
    expect(JSON.parse(event.newValue!).suspendedApiTokens).toContain(made.id);
    // Signing in again with the new password does not revive it.
    expect(temporaryPassword).toBeTruthy();
    expect((await recipesRoute.GET(get("/recipes", made.token), noParams)).status).toBe(401);
  });

  it("is suspended when its owner is deactivated, and stays suspended after reactivation", async () => {
    const made = await createApiToken(people.auditor, { name: "Auditor export", scope: "read" });
    await setUserActive(
      { id: null, name: "test admin" },
      { userId: people.auditor.id, active: false, reason: "left the plant" },
    );
    await setUserActive(
      { id: null, name: "test admin" },
      { userId: people.auditor.id, active: true, reason: "came back" },
    );
    const res = await recipesRoute.GET(get("/recipes", made.token), noParams);
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/suspended .* because the owner was deactivated/);
  });
});
