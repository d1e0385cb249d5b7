import "server-only";
import { asc } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sites } from "@/db/schema";
import { effectiveRecipesOn } from "./effective-recipes";

/** The sites a new washer can stand at. */
export async function listSites() {
  return getDb().select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name));
}

/** "R-AW3-PH v2" for each effective recipe the system runs: the editor says why equipment is locked. */
export async function effectiveRecipeNames(systemId: string) {
  const rows = await effectiveRecipesOn(getDb(), systemId);
  return rows.map((r) => `${r.code} v${r.version}`);
}
