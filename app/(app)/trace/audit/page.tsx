import type { Metadata } from "next";
import { AuditBrowser } from "@/components/audit/audit-browser";
import { VerifyIntegrity } from "@/components/audit/verify-integrity";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { auditFilterOptions } from "@/lib/server/audit/query-audit-events";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listUsers } from "@/lib/server/users/queries";

export const metadata: Metadata = { title: "Audit trail" };

export default async function AuditTrailPage() {
  const user = await requirePageUser("audit.view");
  const [options, users] = await Promise.all([auditFilterOptions(), listUsers()]);
  return (
    <>
      <PageHeader
        title="Audit trail"
        description="Every change to every record: who, what, when, the old and new values and the reason. Append-only and hash-chained, so an altered or removed event is detected."
        actions={<VerifyIntegrity />}
      />
      <AuditBrowser
        actors={[
          { id: "system", name: "system" },
          ...users.map((u) => ({ id: u.id, name: u.name })),
        ]}
        eventTypes={options.eventTypes}
        recordTypes={options.recordTypes}
        canExport={can(user.roles, "audit.export")}
      />
    </>
  );
}
