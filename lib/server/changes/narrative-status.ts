import "server-only";
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { documentVersions, type DocumentVersion } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { todayUtc } from "@/lib/format/date";

/**
 * The change narrative follows its change request: frozen (in review, hashed) when
 * the impact assessment is signed, editable again when reopened, approved, effective
 * at closure, retired when the change is rejected or withdrawn. The change request's
 * own audit event records the step.
 */
export async function setNarrativeStatus(
  tx: Tx,
  documentId: string | null,
  status: DocumentVersion["status"],
  now: Date,
) {
  if (!documentId) return;
  const [v] = await tx
    .select()
    .from(documentVersions)
    .where(eq(documentVersions.documentId, documentId));
  if (!v) return;
  const frozen = status !== "draft";
  await tx
    .update(documentVersions)
    .set({
      status,
      contentHash: frozen ? sha256Hex(canonicalJson(v.content as Record<string, unknown>)) : null,
      effectiveDate: status === "effective" ? todayUtc(now) : v.effectiveDate,
      updatedAt: now.toISOString(),
    })
    .where(eq(documentVersions.id, v.id));
}
