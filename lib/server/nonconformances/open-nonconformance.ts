import "server-only";
import { getDb } from "@/db/client";
import type { AuditActor } from "@/lib/audit";
import { raiseNonconformance, type RaiseNonconformanceInput } from "./raise";

/** A nonconformance reported by hand: a customer complaint, a field return or an audit finding. */
export async function openNonconformance(
  actor: AuditActor & { id: string },
  input: Omit<RaiseNonconformanceInput, "actorId" | "source"> & {
    manualKind: NonNullable<RaiseNonconformanceInput["manualKind"]>;
    reference: string;
  },
) {
  return getDb().transaction((tx) =>
    raiseNonconformance(tx, {
      ...input,
      source: { kind: "manual", id: null, label: input.reference },
      actorId: actor.id,
    }),
  );
}
