import "server-only";
import { and, eq } from "drizzle-orm";
import type { SelectedFields, SQLiteColumn, SQLiteTable } from "drizzle-orm/sqlite-core";
import type { Metadata } from "next";
import { getDb } from "@/db/client";
import {
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  controlPlans,
  deviations,
  documents,
  instruments,
  labMethods,
  nonconformances,
  partFamilies,
  recipes,
  recipeParameters,
  recipeVersions,
  systemStages,
  testRuns,
} from "@/db/schema";
import { can, type Permission } from "@/lib/auth/permissions";
import { getCurrentUser } from "@/lib/server/auth/current-user";

/**
 * The browser tab's name for one record's page ("CR-0042 Raise the wash temperature"), so a
 * plant user with several records open can tell the tabs apart. Each reads one row by its key.
 */
const TITLES = {
  change: {
    permission: "changes.view",
    read: async (id: string) => {
      const r = await byId(
        changeRequests,
        { number: changeRequests.number, title: changeRequests.title },
        id,
      );
      return r && `${r.number} ${r.title}`;
    },
  },
  deviation: {
    permission: "deviation.view",
    read: async (id: string) => {
      const r = await byId(deviations, { number: deviations.number, title: deviations.title }, id);
      return r && `${r.number} ${r.title}`;
    },
  },
  nonconformance: {
    permission: "nc.view",
    read: async (id: string) => {
      const r = await byId(
        nonconformances,
        { number: nonconformances.number, title: nonconformances.title },
        id,
      );
      return r && `${r.number} ${r.title}`;
    },
  },
  run: {
    permission: "evidence.view",
    read: async (id: string) => {
      const r = await byId(testRuns, { number: testRuns.number, revision: testRuns.revision }, id);
      return r && `Test run ${r.number}${r.revision > 1 ? ` rev. ${r.revision}` : ""}`;
    },
  },
  document: {
    permission: "documents.view",
    read: async (id: string) => {
      const r = await byId(documents, { number: documents.number, title: documents.title }, id);
      return r && `${r.number} ${r.title}`;
    },
  },
  controlPlan: {
    permission: "control_plan.view",
    read: async (id: string) => {
      const [r] = await getDb()
        .select({
          recipe: recipes.code,
          version: recipeVersions.version,
          family: partFamilies.code,
        })
        .from(controlPlans)
        .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
        .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
        .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
        .where(eq(controlPlans.id, id));
      return r && `Control plan ${r.recipe} v${r.version} × ${r.family}`;
    },
  },
  instrument: {
    permission: "instrument.view",
    read: async (id: string) => {
      const r = await byId(instruments, { asset: instruments.assetNumber }, id);
      return r && `Instrument ${r.asset}`;
    },
  },
  spec: {
    permission: "parts.view",
    read: async (id: string) => {
      const r = await byId(
        cleanlinessSpecs,
        { code: cleanlinessSpecs.code, revision: cleanlinessSpecs.revision },
        id,
      );
      return r && `Specification ${r.code} rev. ${r.revision}`;
    },
  },
  partFamily: {
    permission: "parts.view",
    read: async (id: string) => {
      const r = await byId(partFamilies, { code: partFamilies.code, name: partFamilies.name }, id);
      return r && `${r.code} ${r.name}`;
    },
  },
  recipe: {
    permission: "systems.view",
    read: async (id: string) => {
      const r = await byId(recipes, { code: recipes.code, name: recipes.name }, id);
      return r && `${r.code} ${r.name}`;
    },
  },
  system: {
    permission: "systems.view",
    read: async (id: string) => {
      const r = await byId(
        cleaningSystems,
        { code: cleaningSystems.code, name: cleaningSystems.name },
        id,
      );
      return r && `${r.code} ${r.name}`;
    },
  },
  tank: {
    permission: "evidence.view",
    read: async (id: string) => {
      const [r] = await getDb()
        .select({ system: cleaningSystems.code, stage: systemStages.name })
        .from(systemStages)
        .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
        .where(eq(systemStages.id, id));
      return r && `Tank log ${r.system} · ${r.stage}`;
    },
  },
  labMethod: {
    permission: "lab.view",
    read: async (id: string) => {
      const r = await byId(labMethods, { code: labMethods.code, name: labMethods.name }, id);
      return r && `${r.code} ${r.name}`;
    },
  },
} satisfies Record<string, { permission: Permission; read: (id: string) => Promise<unknown> }>;

/** One row's `fields`, by its id. */
async function byId<T extends SelectedFields>(
  table: SQLiteTable & { id: SQLiteColumn },
  fields: T,
  id: string,
) {
  const [row] = await getDb().select(fields).from(table).where(eq(table.id, id));
  return row;
}

export type TitledRecord = keyof typeof TITLES;

/**
 * The page's metadata: the record's own name when the user may see the record, else `fallback`
 * (the page itself then refuses, and the tab names nothing it would not show).
 */
export async function recordTitle(
  kind: TitledRecord,
  id: string,
  fallback: string,
): Promise<Metadata> {
  const name = await readableName(kind, id);
  return { title: name ?? fallback };
}

/**
 * The trace of one parameter: "Trace R-W01-001 wash.temperature" when the user may trace and the
 * recipe has that parameter in some version; else "Trace", as the page then says nothing is chosen.
 */
export async function traceTitle(recipeId: string | undefined, key: string | undefined) {
  const user = await getCurrentUser();
  if (!recipeId || !key || !user || !can(user.roles, "trace.view")) return { title: "Trace" };
  if (!/^[0-9a-f-]{36}$/.test(recipeId)) return { title: "Trace" };
  const [found] = await getDb()
    .select({ code: recipes.code })
    .from(recipeParameters)
    .innerJoin(recipeVersions, eq(recipeVersions.id, recipeParameters.versionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipeVersions.recipeId, recipeId), eq(recipeParameters.key, key)))
    .limit(1);
  return { title: found ? `Trace ${found.code} ${key}` : "Trace" };
}

async function readableName(kind: TitledRecord, id: string): Promise<string | null> {
  const entry = TITLES[kind];
  const user = await getCurrentUser();
  if (!user || !can(user.roles, entry.permission) || !/^[0-9a-f-]{36}$/.test(id)) return null;
  const name = await entry.read(id);
  return typeof name === "string" ? name : null;
}
