import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { cleaningSystems } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { RetireSystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";
import { effectiveRecipesOn } from "./effective-recipes";

/** Retires a washer. Its records stay; a system still running effective recipes cannot be retired until they are withdrawn or moved. */
export async function retireSystem(actor: AuditActor, input: RetireSystemInput) {
  await getDb().transaction(async (tx) => {
    const [system] = await tx
      .select()
      .from(cleaningSystems)
      .where(eq(cleaningSystems.id, input.systemId));
    if (!system)
      throw new UserFacingError("That cleaning system does not exist.", { kind: "not_found" });
    if (!system.active) throw new UserFacingError(`${system.code} is already retired.`);
    const running = await effectiveRecipesOn(tx, system.id);
    if (running.length) {
      throw new UserFacingError(
        `${system.code} still runs ${running.map((r) => `${r.code} v${r.version}`).join(", ")}: move or withdraw those recipes through change control before retiring it.`,
      );
    }
    const at = new Date().toISOString();
    await tx
      .update(cleaningSystems)
      .set({ active: false, retiredAt: at, retireReason: input.reason })
      .where(eq(cleaningSystems.id, system.id));
    await appendAudit(tx, actor, {
      eventType: "cleaning_system.retired",
      recordType: "cleaning_system",
      recordId: system.id,
      old: { active: true },
      new: { active: false, retiredAt: at },
      reason: input.reason,
    });
  });
}
