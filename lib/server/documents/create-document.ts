import "server-only";
import { and, asc, count, eq, like, ne } from "drizzle-orm";
import { getDb } from "@/db/client";
import { loadParametersInProcessOrder } from "@/db/recipe-content";
import {
  cleaningSystems,
  cleanlinessSpecs,
  documents,
  documentVersions,
  partFamilies,
  recipes,
  recipeVersions,
  systemStages,
  testRuns,
  testSamples,
  users,
} from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { can } from "@/lib/auth/permissions";
import { documentNumber, numberPrefix } from "@/lib/documents/lifecycle";
import type { CreateDocumentInput } from "@/lib/schemas/document";
import { UserFacingError } from "@/lib/server/errors";
import { successRunSampleSize } from "@/lib/stats";
import { buildTemplate, type TemplateContext } from "@/templates/documents";
import type { DocumentActor } from "./shared";

/** Creates a document with its number and a first draft written from the template for its type. */
export async function createDocument(actor: DocumentActor, input: CreateDocumentInput) {
  if (!can(actor.roles, "document.draft"))
    throw new UserFacingError("Your role does not allow this.", { kind: "forbidden" });
  const db = getDb();
  return db.transaction(async (tx) => {
    const [system] = input.systemId
      ? await tx.select().from(cleaningSystems).where(eq(cleaningSystems.id, input.systemId))
      : [];
    if (input.systemId && !system)
      throw new UserFacingError("Choose a cleaning system from the list.", {
        kind: "invalid",
        field: "systemId",
      });
    const stages = system
      ? await tx
          .select()
          .from(systemStages)
          .where(eq(systemStages.systemId, system.id))
          .orderBy(asc(systemStages.position))
      : [];

    const [family] = input.partFamilyId
      ? await tx
          .select({ f: partFamilies, s: cleanlinessSpecs })
          .from(partFamilies)
          .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
          .where(eq(partFamilies.id, input.partFamilyId))
      : [];
    if (input.partFamilyId && !family)
      throw new UserFacingError("Choose a part family from the list.", {
        kind: "invalid",
        field: "partFamilyId",
      });

    const [recipe] = input.recipeVersionId
      ? await tx
          .select({ v: recipeVersions, r: recipes })
          .from(recipeVersions)
          .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
          .where(eq(recipeVersions.id, input.recipeVersionId))
      : [];
    if (input.recipeVersionId && !recipe)
      throw new UserFacingError("Choose a recipe version from the list.", {
        kind: "invalid",
        field: "recipeVersionId",
      });
    if (recipe && system && recipe.r.systemId !== system.id)
      throw new UserFacingError("This recipe runs on another cleaning system.", {
        kind: "invalid",
        field: "recipeVersionId",
      });
    const params = recipe ? await loadParametersInProcessOrder(tx, [recipe.v.id]) : [];

    // A report opens with the results of the runs on its part family and recipe version.
    const runs =
      input.type === "report" && family && recipe
        ? await tx
            .select({
              number: testRuns.number,
              testType: testRuns.testType,
              outcome: testRuns.outcome,
              status: testRuns.status,
              performedOn: testRuns.performedOn,
              technician: users.name,
              samples: count(testSamples.id),
            })
            .from(testRuns)
            .leftJoin(testSamples, eq(testSamples.runId, testRuns.id))
            .leftJoin(users, eq(users.id, testRuns.technicianId))
            .where(
              and(
                eq(testRuns.partFamilyId, family.f.id),
                eq(testRuns.recipeVersionId, recipe.v.id),
                ne(testRuns.status, "superseded"),
              ),
            )
            .groupBy(testRuns.id)
            .orderBy(asc(testRuns.number))
        : [];

    const prefix = numberPrefix(input.type, system?.code ?? null);
    const taken = await tx
      .select({ number: documents.number })
      .from(documents)
      .where(like(documents.number, `${prefix}%`));
    const sequence =
      taken.reduce((max, d) => Math.max(max, Number(d.number.slice(prefix.length)) || 0), 0) + 1;
    const number = documentNumber(input.type, system?.code ?? null, sequence);

    const ctx: TemplateContext = {
      type: input.type,
      number,
      title: input.title,
      system: system
        ? { code: system.code, name: system.name, stages: stages.map((s) => s.name) }
        : null,
      partFamily: family
        ? {
            code: family.f.code,
            name: family.f.name,
            material: family.f.material,
            wettedAreaCm2: family.f.wettedAreaCm2,
            spec: family.s,
          }
        : null,
      recipe: recipe
        ? {
            code: recipe.r.code,
            name: recipe.r.name,
            version: recipe.v.version,
            parameters: params.map((x) => ({
              name: x.name,
              setpoint: x.setpoint,
              unit: x.unit,
              low: x.validatedLow,
              high: x.validatedHigh,
            })),
          }
        : null,
      sample: {
        confidencePct: input.confidencePct,
        reliabilityPct: input.reliabilityPct,
        size: successRunSampleSize(input.confidencePct / 100, input.reliabilityPct / 100),
      },
      runs,
    };
    const content = buildTemplate(ctx);

    const [document] = await tx
      .insert(documents)
      .values({
        number,
        title: input.title,
        type: input.type,
        systemId: system?.id ?? null,
        partFamilyId: family?.f.id ?? null,
        recipeVersionId: recipe?.v.id ?? null,
        ownerId: actor.id,
      })
      .returning();
    const [version] = await tx
      .insert(documentVersions)
      .values({ documentId: document.id, version: 1, content, createdBy: actor.id })
      .returning();
    await appendAudit(tx, actor, {
      eventType: "document.created",
      recordType: "document",
      recordId: document.id,
      new: {
        number,
        title: input.title,
        type: input.type,
        system: system?.code ?? null,
        partFamily: family?.f.code ?? null,
        recipeVersion: recipe ? `${recipe.r.code} v${recipe.v.version}` : null,
        versionId: version.id,
        sampleSize: ctx.sample.size,
      },
    });
    return { documentId: document.id, number, versionId: version.id };
  });
}
