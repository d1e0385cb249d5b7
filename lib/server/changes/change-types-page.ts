import "server-only";
import { getDb } from "@/db/client";
import { emergencyApprovalState, latestApprovalDue } from "@/lib/changes/emergency";
import { affectedDocumentsMissing } from "@/lib/changes/affected-documents";
import { todayUtc } from "@/lib/format/date";
import { listControlledDocuments, loadAffectedDocuments } from "./affected-documents";
import { loadEffectiveness } from "./effectiveness";
import { loadEmergencies } from "./emergencies";
import { getChangeControlSettings } from "./settings";
import { loadCustomerApproval } from "./customer-approval";

/** What a change request's page shows of its emergency, affected documents and effectiveness check. */
export async function getChangeTypesPanel(
  state: Parameters<typeof loadCustomerApproval>[1],
  now = new Date(),
) {
  const db = getDb();
  const cr = state.cr;
  const today = todayUtc(now);
  const emergency = (await loadEmergencies(db, [cr.id])).get(cr.id) ?? null;
  const settings = await getChangeControlSettings(db);
  const affected = await loadAffectedDocuments(db, cr);
  const listed = new Set(affected.map((a) => a.documentId));
  const register = (await listControlledDocuments(db)).filter((d) => !listed.has(d.id));
  const effectiveness = (await loadEffectiveness(db, [cr.id])).get(cr.id) ?? null;
  return {
    today,
    settings,
    latestDue: latestApprovalDue(today, settings.emergencyApprovalDays),
    emergency,
    approval: emergency
      ? emergencyApprovalState({ status: cr.status, approvalDueOn: emergency.approvalDueOn, today })
      : null,
    affected,
    documentsMissing: affectedDocumentsMissing(affected),
    register,
    effectiveness,
    customer: await loadCustomerApproval(db, state),
  };
}
