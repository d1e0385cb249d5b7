import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformances, signatures } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { closureProblem } from "@/lib/nonconformances/lifecycle";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { UserFacingError } from "@/lib/server/errors";
import { loadNc, ncFacts, ncHash } from "./shared";

/**
 * Closure takes two signatures on the same content: the engineer who authored the
 * investigation, then an approver who is someone else (segregation of duties,
 * lib/signatures/rules.ts). The approval closes it. Call after verifySigner.
 */
export async function signClosureIn(
  tx: Tx,
  signer: { id: string; name: string },
  input: { nonconformanceId: string; meaning: "authored" | "approved"; contentHash: string },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  if (nc.status !== "effectiveness_check")
    throw new UserFacingError(
      nc.status === "closed"
        ? `${nc.number} is already closed.`
        : "Closure is signed once the nonconformance is at its effectiveness check.",
    );
  const problem = closureProblem(await ncFacts(tx, nc));
  if (problem) throw new UserFacingError(problem);
  const hash = await ncHash(tx, nc);
  if (hash !== input.contentHash)
    throw new UserFacingError(
      "The nonconformance changed after you opened it. Reload the page, check it again and sign.",
    );
  if (input.meaning === "approved") {
    const [authored] = await tx
      .select()
      .from(signatures)
      .where(
        and(
          eq(signatures.recordType, "nonconformance"),
          eq(signatures.recordId, nc.id),
          eq(signatures.meaning, "authored"),
          eq(signatures.contentHash, hash),
        ),
      );
    if (!authored)
      throw new UserFacingError(
        "The engineer signs the investigation as authored before approval.",
      );
  }
  await applySignature(
    tx,
    {
      signer,
      recordType: "nonconformance",
      recordId: nc.id,
      meaning: input.meaning,
      contentHash: hash,
    },
    now,
  );
  if (input.meaning === "approved") {
    await tx
      .update(nonconformances)
      .set({ status: "closed", closedAt: now.toISOString() })
      .where(eq(nonconformances.id, nc.id));
    await appendAudit(
      tx,
      signer,
      {
        eventType: "nonconformance.status_changed",
        recordType: "nonconformance",
        recordId: nc.id,
        old: { status: nc.status },
        new: { status: "closed" },
      },
      now,
    );
  }
}

export const signClosure = (
  signer: { id: string; name: string },
  input: Parameters<typeof signClosureIn>[2],
) => getDb().transaction((tx) => signClosureIn(tx, signer, input));
