import { count, eq, sql } from "drizzle-orm";
import { pathToFileURL } from "node:url";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { asOf } from "@/lib/audit/seed-stamp";
import { hashPassword } from "@/lib/auth/password";
import { partFamilySchema } from "@/lib/schemas/part-family";
import { specSchema } from "@/lib/schemas/spec";
import { createSystemSchema } from "@/lib/schemas/system";
import { createSystemIn } from "@/lib/server/systems/create-system";
import { createPartFamilyIn } from "@/lib/server/plant/create-part-family";
import { createSpecIn } from "@/lib/server/plant/create-spec";
import { createRecipeIn } from "@/lib/server/plant/create-recipe";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { setUpPlantIn } from "@/lib/server/plant/set-up-plant";
import { getDb, type Database } from "./client";
import { seedDemoDocuments } from "./seed-documents";
import { recipeParameters, recipeStages, recipeVersions, sites, userRoles, users } from "./schema";
import { seedEvidence } from "./seed-evidence";
import { seedBathPlan } from "./seed-bath-plan";
import { seedChangeControl } from "./seed-changes";
import { seedDeviations } from "./seed-deviations";
import { seedInstruments } from "./seed-instruments";
import { seedCycles } from "./seed-cycles";
import { seedLabReport } from "./seed-lab-report";
import { citeOnOpenRuns, seedLabMethods } from "./seed-lab-methods";
import { seedNonconformances } from "./seed-nonconformances";
import { seedChangeTypes } from "./seed-change-types";
import { seedControlPlans } from "./seed-control-plans";
import {
  DEMO_COMPANY,
  DEMO_PART_FAMILIES,
  DEMO_PASSWORD,
  DEMO_RECIPES,
  DEMO_SITE,
  DEMO_SPECS,
  DEMO_SYSTEMS,
  DEMO_USERS,
} from "./seed-data";

/** The invented plant's first day in Washproof, and the week its master data was entered. */
const DEMO_FIRST_DAY = "2025-01-13T08:00:00.000Z";
const MASTER_DATA_AT = "2025-01-20T09:00:00.000Z";
const ENGINEER = "engineer@fennmoor.example";
const APPROVER = "approver@fennmoor.example";
/** A recipe version is drafted two weeks before it takes effect. */
const draftedBefore = (effectiveFrom: string) =>
  new Date(new Date(effectiveFrom).getTime() - 14 * 24 * 60 * 60 * 1000).toISOString();

/**
 * Loads the invented demo scenario. Idempotent: a database that already holds
 * the demo site is left as it is. Every row is audited, as any other change.
 */
export async function seedDemo(db: Database): Promise<{ seeded: boolean }> {
  const existing = await db
    .select({ id: sites.id })
    .from(sites)
    .where(eq(sites.name, DEMO_SITE.name));
  if (existing.length > 0) return { seeded: false };

  // Hash outside the transaction: argon2 is deliberately slow.
  const hashes = await Promise.all(DEMO_USERS.map(() => hashPassword(DEMO_PASSWORD)));

  const [{ n: existingUsers }] = await db.select({ n: count() }).from(users);

  await db.transaction(async (tx) => {
    const audit = (input: Parameters<typeof appendAudit>[2]) =>
      appendAudit(tx, SYSTEM_ACTOR, input);
    const userIds = new Map<string, string>();
    // The demo's events carry the days its story describes and the people who acted in it.
    const actorOf = (email: string) => {
      const id = userIds.get(email);
      return id ? { id, name: DEMO_USERS.find((u) => u.email === email)!.name } : null;
    };
    // An empty installation is set up the way a plant sets itself up: first administrator, company, site.
    const firstAdmin = DEMO_USERS.find((u) => u.roles.includes("admin"))!;
    let siteId: string;
    if (existingUsers === 0) {
      const setUp = await asOf(DEMO_FIRST_DAY, null, () =>
        setUpPlantIn(tx, {
          companyName: DEMO_COMPANY,
          siteName: DEMO_SITE.name,
          siteLocation: DEMO_SITE.location,
          adminName: firstAdmin.name,
          adminEmail: firstAdmin.email,
          jobTitle: firstAdmin.jobTitle,
          passwordHash: hashes[DEMO_USERS.indexOf(firstAdmin)],
        }),
      );
      userIds.set(firstAdmin.email, setUp.adminId);
      siteId = setUp.siteId;
    } else {
      const [site] = await tx.insert(sites).values(DEMO_SITE).returning();
      await asOf(DEMO_FIRST_DAY, actorOf(firstAdmin.email), () =>
        audit({
          eventType: "site.created",
          recordType: "site",
          recordId: site.id,
          new: DEMO_SITE,
        }),
      );
      siteId = site.id;
    }
    for (const [i, u] of DEMO_USERS.entries()) {
      if (userIds.has(u.email)) continue;
      const [row] = await tx
        .insert(users)
        .values({ name: u.name, email: u.email, jobTitle: u.jobTitle, passwordHash: hashes[i] })
        .onConflictDoNothing()
        .returning({ id: users.id });
      if (!row) continue; // someone already created this e-mail by hand
      userIds.set(u.email, row.id);
      await tx.insert(userRoles).values(u.roles.map((role) => ({ userId: row.id, role })));
      await asOf(DEMO_FIRST_DAY, actorOf(firstAdmin.email), () =>
        audit({
          eventType: "user.created",
          recordType: "user",
          recordId: row.id,
          new: { name: u.name, email: u.email, jobTitle: u.jobTitle, roles: [...u.roles].sort() },
        }),
      );
    }
    const engineerId = userIds.get("engineer@fennmoor.example") ?? null;

    const systemIds = new Map<string, string>();
    for (const s of DEMO_SYSTEMS) {
      const sys = await asOf(MASTER_DATA_AT, actorOf(ENGINEER), () =>
        createSystemIn(
          tx,
          SYSTEM_ACTOR,
          siteId,
          createSystemSchema.parse({ ...s, stages: s.stages.map((st) => ({ ...st, id: null })) }),
        ),
      );
      systemIds.set(s.code, sys.id);
    }

    // Specifications and part families go through the same services and schemas as a plant's own.
    const specIds = new Map<string, string>();
    for (const spec of DEMO_SPECS) {
      const row = await asOf(MASTER_DATA_AT, actorOf(ENGINEER), () =>
        createSpecIn(tx, SYSTEM_ACTOR, specSchema.parse(spec)),
      );
      specIds.set(spec.code, row.id);
    }

    const familyIds = new Map<string, string>();
    for (const pf of DEMO_PART_FAMILIES) {
      const { spec, ...fields } = pf;
      const row = await asOf(MASTER_DATA_AT, actorOf(ENGINEER), () =>
        createPartFamilyIn(
          tx,
          SYSTEM_ACTOR,
          partFamilySchema.parse({ ...fields, specId: specIds.get(spec)! }),
        ),
      );
      familyIds.set(pf.code, row.id);
    }

    const recipeIds = new Map<string, string>();
    const engineer = engineerId
      ? {
          id: engineerId,
          name: DEMO_USERS.find((u) => u.email === "engineer@fennmoor.example")!.name,
        }
      : SYSTEM_ACTOR;
    for (const r of DEMO_RECIPES) {
      let previous: { id: string; version: number } | null = null;
      for (const [i, v] of r.versions.entries()) {
        const isLast = i === r.versions.length - 1;
        const next = r.versions[i + 1];
        if (i === 0) {
          // The first version is written as a plant writes it, through the recipe service (its
          // rules: process order, own ranges, physical limits, modes the washer can run); it was
          // validated before the demo's records begin, so it then takes its place in the history.
          const { recipe: created, version } = await asOf(
            draftedBefore(v.effectiveFrom),
            actorOf(ENGINEER),
            () =>
              createRecipeIn(
                tx,
                engineer,
                createRecipeSchema.parse({
                  systemId: systemIds.get(r.system)!,
                  code: r.code,
                  name: r.name,
                  description: r.description,
                  content: {
                    detergent: v.detergent ?? "",
                    notes: v.notes ?? "",
                    stages: v.stages.map((st) => ({
                      name: st.name,
                      kind: st.kind,
                      mode: st.mode,
                      parameters: st.parameters.map((p) => ({
                        key: p.key,
                        name: p.name,
                        kind: p.kind,
                        setpoint: p.setpoint,
                        unit: p.unit,
                        validatedLow: p.low,
                        validatedHigh: p.high,
                        critical: p.critical ?? false,
                      })),
                    })),
                  },
                }),
              ),
          );
          recipeIds.set(r.code, created.id);
          await tx
            .update(recipeVersions)
            .set({
              status: isLast ? "effective" : "superseded",
              effectiveFrom: v.effectiveFrom,
              effectiveTo: next?.effectiveFrom ?? null,
            })
            .where(eq(recipeVersions.id, version.id));
          await asOf(v.effectiveFrom, actorOf(APPROVER), () =>
            audit({
              eventType: "recipe_version.effective",
              recordType: "recipe_version",
              recordId: version.id,
              new: { status: "effective", effectiveFrom: v.effectiveFrom },
            }),
          );
          previous = { id: version.id, version: 1 };
          continue;
        }
        const recipe = { id: recipeIds.get(r.code)! };
        const [version] = await tx
          .insert(recipeVersions)
          .values({
            recipeId: recipe.id,
            version: i + 1,
            status: isLast ? "effective" : "superseded",
            detergent: v.detergent,
            notes: v.notes,
            effectiveFrom: v.effectiveFrom,
            effectiveTo: next?.effectiveFrom ?? null,
            createdBy: engineerId,
          })
          .returning();
        for (const [si, s] of v.stages.entries()) {
          const [stage] = await tx
            .insert(recipeStages)
            .values({
              versionId: version.id,
              position: si + 1,
              name: s.name,
              kind: s.kind,
              mode: s.mode as never,
            })
            .returning();
          await tx.insert(recipeParameters).values(
            s.parameters.map((p) => ({
              versionId: version.id,
              stageId: stage.id,
              key: p.key,
              name: p.name,
              kind: p.kind,
              setpoint: p.setpoint,
              unit: p.unit,
              validatedLow: p.low,
              validatedHigh: p.high,
              critical: p.critical ?? false,
            })),
          );
        }
        await asOf(draftedBefore(v.effectiveFrom), actorOf(ENGINEER), () =>
          audit({
            eventType: "recipe_version.created",
            recordType: "recipe_version",
            recordId: version.id,
            new: { recipe: r.code, version: i + 1, notes: v.notes },
          }),
        );
        if (previous) {
          const superseded = previous;
          await asOf(v.effectiveFrom, actorOf(APPROVER), () =>
            audit({
              eventType: "recipe_version.superseded",
              recordType: "recipe_version",
              recordId: superseded.id,
              old: { status: "effective" },
              new: { status: "superseded", effectiveTo: v.effectiveFrom, by: i + 1 },
            }),
          );
        }
        await asOf(v.effectiveFrom, actorOf(APPROVER), () =>
          audit({
            eventType: "recipe_version.effective",
            recordType: "recipe_version",
            recordId: version.id,
            new: { status: "effective", effectiveFrom: v.effectiveFrom },
          }),
        );
        previous = { id: version.id, version: i + 1 };
      }
    }

    const person = (email: string) => {
      const u = DEMO_USERS.find((x) => x.email === email)!;
      return { id: userIds.get(email)!, name: u.name };
    };
    if (["engineer", "reviewer", "approver"].every((r) => userIds.has(`${r}@fennmoor.example`))) {
      await seedDemoDocuments(tx, {
        engineer: person("engineer@fennmoor.example"),
        reviewer: person("reviewer@fennmoor.example"),
        approver: person("approver@fennmoor.example"),
      });
    }

    await seedInstruments(tx);
    await seedEvidence(tx);
    await seedBathPlan(tx);
    await seedChangeControl(tx, { userIds, recipeIds, familyIds });
    await seedDeviations(tx, { userIds, recipeIds, familyIds });
    await seedCycles(tx);
    const methods = await seedLabMethods(tx);
    await seedLabReport(tx, methods);
    if (methods) await citeOnOpenRuns(tx, methods);
    if (["engineer", "approver"].every((r) => userIds.has(`${r}@fennmoor.example`)))
      await seedNonconformances(tx, {
        engineer: person("engineer@fennmoor.example"),
        approver: person("approver@fennmoor.example"),
      });
    if (["engineer", "reviewer", "approver"].every((r) => userIds.has(`${r}@fennmoor.example`)))
      await seedControlPlans(tx, {
        engineer: person("engineer@fennmoor.example"),
        reviewer: person("reviewer@fennmoor.example"),
        approver: person("approver@fennmoor.example"),
      });
  });
  await seedChangeTypes(db);
  // The statistics taken at migration described empty tables: the planner needs the seeded ones.
  await db.run(sql`ANALYZE`);
  return { seeded: true };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  const result = await seedDemo(getDb());
  console.log(result.seeded ? "Demo data loaded." : "Demo data already present; nothing changed.");
}
