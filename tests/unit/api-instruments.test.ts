import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as openapiRoute from "@/app/api/v1/openapi.json/route";
import * as extractionRoute from "@/app/api/v1/test-runs/[runId]/extraction-series/route";
import * as filesRoute from "@/app/api/v1/test-runs/[runId]/files/route";
import * as testRunsRoute from "@/app/api/v1/test-runs/route";
import {
  auditEvents,
  evidenceFiles,
  partFamilies,
  recipes,
  recipeVersions,
  testRuns,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { fileAttachedOut, testRunDetailOut } from "@/lib/schemas/api";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { createTestDatabase } from "./support/test-db";

// An instrument opens a run, posts the extraction series and blank, and attaches its report:
// each through the same service as the screens, so the same checks and audit events apply.

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const BASE = "http://127.0.0.1/api/v1";
let techWrite = "";
let techRead = "";
let technicianId = "";
let familyId = "";
let versionId = "";
let runId = "";

const json = (path: string, token: string, body: unknown) =>
  new Request(`${BASE}${path}`, {
    method: "POST",
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify(body),
  });
function params(): { params: Promise<Record<string, string>> };
function params<P extends Record<string, string>>(p: P): { params: Promise<P> };
function params(p: Record<string, string> = {}) {
  return { params: Promise.resolve(p) };
}
const runBody = () => ({
  partFamilyId: familyId,
  recipeVersionId: versionId,
  testType: "particle_cleanliness",
  technicianId,
  lab: "Larchfield cleanliness lab",
  performedOn: "2026-11-24",
});
const upload = (token: string, fields: Record<string, string | File>) => {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  return filesRoute.POST(
    new Request(`${BASE}/test-runs/${runId}/files`, {
      method: "POST",
      headers: { authorization: `Bearer ${token}` },
      body: form,
    }),
    params({ runId }),
  );
};
const auditOf = (recordId: string, action: string) =>
  t.db
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.recordId, recordId), eq(auditEvents.action, action)));

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  const [tech] = await t.db
    .select()
    .from(users)
    .where(eq(users.email, "technician@fennmoor.example"));
  technicianId = tech.id;
  techWrite = (
    await createApiToken({ id: tech.id, name: tech.name }, { name: "Counter", scope: "read_write" })
  ).token;
  techRead = (
    await createApiToken({ id: tech.id, name: tech.name }, { name: "Reader", scope: "read" })
  ).token;
  const [family] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
  familyId = family.id;
  const [version] = await t.db
    .select({ id: recipeVersions.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  versionId = version.id;
});
afterAll(() => t.cleanup());

describe("instrument API", () => {
  it("opens a test run through the run service: numbered, audited under the token's owner", async () => {
    const res = await testRunsRoute.POST(json("/test-runs", techWrite, runBody()), params());
    expect(res.status).toBe(201);
    const run = testRunDetailOut.parse(await res.json());
    expect(run).toMatchObject({
      testType: "particle_cleanliness",
      status: "open",
      partFamilyCode: "PF-VB-210",
      runData: null,
    });
    expect(run.number).toMatch(/^TR-\d{4}$/);
    runId = run.id;
    const [event] = await auditOf(run.id, "test_run.created");
    expect(event.actorId).toBe(technicianId);
    expect(event.actorName).toMatch(/\(API token /);
  });

  it("refuses to open a run with a read token, an unknown or mis-cased key, or an unqualified combination", async () => {
    const before = (await t.db.select().from(testRuns)).length;
    expect(
      (await testRunsRoute.POST(json("/test-runs", techRead, runBody()), params())).status,
    ).toBe(403);
    const extra = await testRunsRoute.POST(
      json("/test-runs", techWrite, { ...runBody(), Lab: "x" }),
      params(),
    );
    expect(extra.status).toBe(422);
    expect(Object.keys((await extra.json()).fieldErrors)).toContain("Lab");
    const [other] = await t.db
      .select({ id: recipeVersions.id })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(eq(recipes.code, "R-AW3-PH"));
    // The valve body is not validated on the pump-housing recipe: the run service refuses it, as on the screen.
    const wrong = await testRunsRoute.POST(
      json("/test-runs", techWrite, { ...runBody(), recipeVersionId: other.id }),
      params(),
    );
    expect(wrong.status).toBe(409);
    expect((await wrong.json()).fieldErrors).toHaveProperty("recipeVersionId");
    expect((await t.db.select().from(testRuns)).length).toBe(before);
  });

  it("records the extraction series and blank through the run-data service, and refuses them without a blank", async () => {
    const series = { extractionSeries: [410, 72, 9], blank: { counts: { B: 3, C: 1 } } };
    const res = await extractionRoute.POST(
      json(`/test-runs/${runId}/extraction-series`, techWrite, series),
      params({ runId }),
    );
    expect(res.status).toBe(200);
    const run = testRunDetailOut.parse(await res.json());
    expect(run.runData).toEqual({
      extractionSeries: [410, 72, 9],
      blank: { counts: { B: 3, C: 1 }, largestUm: null },
    });
    expect(await auditOf(runId, "test_run.data_saved")).toHaveLength(1);

    const noBlank = await extractionRoute.POST(
      json(`/test-runs/${runId}/extraction-series`, techWrite, { extractionSeries: [1] }),
      params({ runId }),
    );
    expect(noBlank.status).toBe(422);
    expect(Object.keys((await noBlank.json()).fieldErrors)).toContain("blank");
    // A lowercase class is refused by name, never dropped (the blank would read as clean).
    const lower = await extractionRoute.POST(
      json(`/test-runs/${runId}/extraction-series`, techWrite, {
        extractionSeries: [1],
        blank: { counts: { b: 100 } },
      }),
      params({ runId }),
    );
    expect(lower.status).toBe(422);
    expect(JSON.stringify(await lower.json())).toContain("b");
    expect(await auditOf(runId, "test_run.data_saved")).toHaveLength(1);
  });

  it("attaches a file through the evidence store: hashed, audited, listed on the run; refuses unknown fields and a disguised file", async () => {
    const csv = new File(["class,count\nB,3\nC,1\n"], "blank-counts.csv", { type: "text/csv" });
    const res = await upload(techWrite, { file: csv, kind: "lab_report" });
    expect(res.status).toBe(201);
    const body = fileAttachedOut.parse(await res.json());
    expect(body.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(body.run.files.map((f) => f.originalName)).toEqual(["blank-counts.csv"]);
    expect(await auditOf(body.fileId, "evidence_file.uploaded")).toHaveLength(1);

    const unknown = await upload(techWrite, { file: csv, kind: "lab_report", Sample: "VB-1" });
    expect(unknown.status).toBe(422);
    expect((await unknown.json()).error).toMatch(/Sample/);
    const html = new File(["<!doctype html><html><body>hi</body></html>"], "membrane.png");
    const disguised = await upload(techWrite, { file: html, kind: "membrane_image" });
    expect(disguised.status).toBe(422);
    expect((await disguised.json()).error).toMatch(/HTML/);
    const asJson = await filesRoute.POST(
      json(`/test-runs/${runId}/files`, techWrite, { kind: "lab_report" }),
      params({ runId }),
    );
    expect(asJson.status).toBe(415);
    expect((await upload(techRead, { file: csv, kind: "lab_report" })).status).toBe(403);
    expect(
      await t.db.select().from(evidenceFiles).where(eq(evidenceFiles.runId, runId)),
    ).toHaveLength(1);
  });

  it("describes the three operations in the OpenAPI document", async () => {
    const doc = await openapiRoute.GET().json();
    expect(doc.paths["/test-runs"].post.operationId).toBe("openTestRun");
    expect(
      doc.paths["/test-runs/{runId}/extraction-series"].post.requestBody.content["application/json"]
        .schema.required,
    ).toEqual(expect.arrayContaining(["extractionSeries", "blank"]));
    expect(
      doc.paths["/test-runs/{runId}/files"].post.requestBody.content["multipart/form-data"].schema
        .required,
    ).toEqual(["file", "kind"]);
    expect(doc.paths["/test-runs/{runId}/files"].post.responses["201"]).toBeDefined();
  });
});
