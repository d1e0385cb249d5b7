// Not "server-only": the demo seed signs its deviation under tsx; people sign through sign-deviation.ts.
import { and, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { deviations, userRoles, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { stepProblem } from "@/lib/deviations/rules";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { UserFacingError } from "@/lib/server/errors";
import { deviationApprovalEmail } from "@/templates/email/deviation";
import { runDeviationJobIn } from "./run-deviation-job";
import { loadDeviation } from "./state";

/**
 * The author signs "authored" on the draft, then another person signs "approved" on the same
 * content, which makes it active. Both bind to the content hash the signer was shown.
 */
export async function signDeviationIn(
  tx: Tx,
  signer: { id: string; name: string },
  input: { deviationId: string; meaning: "authored" | "approved"; contentHash: string },
  now = new Date(),
) {
  const view = await loadDeviation(tx, input.deviationId, now);
  const problem = stepProblem(
    input.meaning === "authored" ? "sign_authored" : "approve",
    view.state,
  );
  if (problem) throw new UserFacingError(problem);
  if (view.contentHash !== input.contentHash)
    throw new UserFacingError(
      "This deviation changed since you opened it. Nothing was signed; read it again and sign what is shown.",
    );
  const authored = view.signatures.find(
    (s) => s.meaning === "authored" && s.contentHash === view.contentHash,
  );
  if (input.meaning === "authored") {
    if (signer.id !== view.deviation.createdBy)
      throw new UserFacingError("Only the person who drafted this deviation signs it as author.", {
        kind: "forbidden",
      });
  } else if (!authored) {
    throw new UserFacingError("The author signs this deviation before it can be approved.");
  }
  // Refuses the author's approval too (segregation of duties).
  await applySignature(
    tx,
    {
      signer,
      recordType: "deviation",
      recordId: view.deviation.id,
      meaning: input.meaning,
      contentHash: view.contentHash,
    },
    now,
  );
  if (input.meaning === "authored") {
    const approvers = await tx
      .select({ email: users.email })
      .from(users)
      .innerJoin(userRoles, eq(userRoles.userId, users.id))
      .where(and(eq(userRoles.role, "approver"), eq(users.active, true)));
    const mail = deviationApprovalEmail({
      number: view.deviation.number,
      title: view.deviation.title,
      recipe: view.recipe.code,
      authorName: signer.name,
      deviationId: view.deviation.id,
    });
    for (const a of approvers) await enqueueEmail(tx, { to: a.email, ...mail }, now);
    return;
  }
  await tx
    .update(deviations)
    .set({ status: "approved", approvedAt: now.toISOString() })
    .where(eq(deviations.id, view.deviation.id));
  await appendAudit(
    tx,
    signer,
    {
      eventType: "deviation.approved",
      recordType: "deviation",
      recordId: view.deviation.id,
      old: { status: "draft" },
      new: { status: "approved", contentHash: view.contentHash },
    },
    now,
  );
  // A deviation approved within its reminder window is reminded at once, not at the next pass.
  await runDeviationJobIn(tx, now, view.deviation.id);
}
