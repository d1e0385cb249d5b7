import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { requalificationMatrices, requalificationMatrixRows } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { matrixRowLine as line, type MatrixRow } from "@/lib/changes/requalification";

/**
 * Saves the matrix as a new version and supersedes the previous one. Change
 * requests already assessed keep the version (and the tests) they were assessed with.
 */
export async function versionMatrix(
  actor: AuditActor & { id: string },
  input: { note: string; rows: MatrixRow[] },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(requalificationMatrices)
      .orderBy(desc(requalificationMatrices.version))
      .limit(1);
    const oldRows = current
      ? await tx
          .select()
          .from(requalificationMatrixRows)
          .where(eq(requalificationMatrixRows.matrixId, current.id))
      : [];
    if (current)
      await tx
        .update(requalificationMatrices)
        .set({ status: "superseded" })
        .where(eq(requalificationMatrices.status, "effective"));
    const [matrix] = await tx
      .insert(requalificationMatrices)
      .values({
        version: (current?.version ?? 0) + 1,
        status: "effective",
        note: input.note,
        createdBy: actor.id,
        createdAt: now.toISOString(),
      })
      .returning();
    await tx
      .insert(requalificationMatrixRows)
      .values(input.rows.map((r) => ({ ...r, matrixId: matrix.id })));
    const before = new Set(oldRows.map((r) => line(r as MatrixRow)));
    const after = new Set(input.rows.map(line));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "requalification_matrix.versioned",
        recordType: "requalification_matrix",
        recordId: matrix.id,
        old: current
          ? { version: current.version, removed: [...before].filter((l) => !after.has(l)) }
          : null,
        new: {
          version: matrix.version,
          added: [...after].filter((l) => !before.has(l)),
          rows: input.rows.length,
        },
        reason: input.note,
      },
      now,
    );
    return matrix;
  });
}
