import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformances } from "@/db/schema";
import { appendAudit, canonicalJson, sha256Hex, type AuditActor } from "@/lib/audit";
import type { RichDoc } from "@/lib/documents/rich-text";
import { plainText } from "@/lib/documents/rich-text";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

/** The root cause as rich text, with the method that found it; kept while the NC is worked. */
export async function saveRootCauseIn(
  tx: Tx,
  actor: AuditActor,
  input: {
    nonconformanceId: string;
    method: "five_whys" | "cause_and_effect" | "other";
    content: RichDoc;
  },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  if (nc.status === "effectiveness_check")
    throw new UserFacingError(
      "The effectiveness check is under way: the root cause it tests can no longer change.",
    );
  if (!plainText(input.content).trim())
    throw new UserFacingError("Describe the root cause.", { kind: "invalid", field: "content" });
  const hash = (v: unknown) => sha256Hex(canonicalJson(v as Record<string, unknown>));
  await tx
    .update(nonconformances)
    .set({ causeMethod: input.method, rootCause: input.content })
    .where(eq(nonconformances.id, nc.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.root_cause_saved",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { method: nc.causeMethod, contentHash: nc.rootCause ? hash(nc.rootCause) : null },
      new: { method: input.method, contentHash: hash(input.content) },
    },
    now,
  );
}

export const saveRootCause = (actor: AuditActor, input: Parameters<typeof saveRootCauseIn>[2]) =>
  getDb().transaction((tx) => saveRootCauseIn(tx, actor, input));
