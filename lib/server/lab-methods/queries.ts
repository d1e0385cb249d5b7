import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { labMethods, testRuns, users, type LabMethodKind } from "@/db/schema";

/** The method register: every version, newest version of each code first. */
export async function listMethods() {
  return getDb()
    .select({ method: labMethods, author: users.name })
    .from(labMethods)
    .innerJoin(users, eq(users.id, labMethods.createdBy))
    .orderBy(asc(labMethods.code), desc(labMethods.version));
}

/** The approved version of each method, by kind: what a run may cite. */
export async function approvedMethods(kind?: LabMethodKind) {
  return getDb()
    .select()
    .from(labMethods)
    .where(and(eq(labMethods.status, "approved"), kind ? eq(labMethods.kind, kind) : undefined))
    .orderBy(asc(labMethods.code));
}

/** Verified particle runs, newest first: the candidates for an extraction procedure's qualification. */
export async function qualificationRuns(limit = 200) {
  return getDb()
    .select({ id: testRuns.id, number: testRuns.number, revision: testRuns.revision })
    .from(testRuns)
    .where(and(eq(testRuns.testType, "particle_cleanliness"), eq(testRuns.status, "verified")))
    .orderBy(desc(testRuns.createdAt))
    .limit(limit);
}
