import "server-only";
import { and, eq, inArray, or } from "drizzle-orm";
import { getDb } from "@/db/client";
import { partFamilies, signatures, testRuns } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { humanize } from "@/lib/format/labels";
import type { QueueProvider } from "@/lib/server/queue/types";

/** Open runs assigned to the technician (to perform) and performed runs someone else signed (to verify). */
export const evidenceQueueProvider: QueueProvider = async (user) => {
  const db = getDb();
  const items = [];
  if (can(user.roles, "evidence.record")) {
    const open = await db
      .select({ run: testRuns, family: partFamilies.code })
      .from(testRuns)
      .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
      .where(and(eq(testRuns.status, "open"), or(eq(testRuns.technicianId, user.id), eq(testRuns.createdBy, user.id))));
    items.push(
      ...open.map(({ run, family }) => ({
        id: `perform:${run.id}`,
        kind: "Perform test",
        title: `${run.number}${run.revision > 1 ? ` rev ${run.revision}` : ""} · ${humanize(run.testType)}`,
        detail: `${family}, lab ${run.lab ?? "—"}; record the samples and sign as performed`,
        href: `/evidence/runs/${run.id}`,
        due: run.performedOn ? `${run.performedOn}T23:59:59.000Z` : null,
      })),
    );
  }
  if (can(user.roles, "evidence.verify")) {
    const performed = await db
      .select({ run: testRuns, family: partFamilies.code })
      .from(testRuns)
      .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
      .where(eq(testRuns.status, "performed"));
    const mine = performed.length
      ? await db
          .select({ recordId: signatures.recordId })
          .from(signatures)
          .where(and(eq(signatures.recordType, "test_run"), eq(signatures.userId, user.id), inArray(signatures.recordId, performed.map((p) => p.run.id))))
      : [];
    const signedByMe = new Set(mine.map((m) => m.recordId));
    items.push(
      ...performed
        .filter(({ run }) => !signedByMe.has(run.id))
        .map(({ run, family }) => ({
          id: `verify:${run.id}`,
          kind: "Verify test",
          title: `${run.number}${run.revision > 1 ? ` rev ${run.revision}` : ""} · ${humanize(run.testType)}`,
          detail: `${family}; performed, waiting for a second person's check`,
          href: `/evidence/runs/${run.id}`,
          due: null,
        })),
    );
  }
  return items;
};
