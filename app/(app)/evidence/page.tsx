import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { EvidenceTable } from "@/components/evidence/evidence-table";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { evidenceFilterOptions } from "@/lib/server/evidence/queries";

export const metadata: Metadata = { title: "Evidence" };

export default async function EvidencePage() {
  const user = await requirePageUser("evidence.view");
  const options = await evidenceFilterOptions();
  return (
    <>
      <PageHeader
        title="Evidence"
        description="Test runs with their raw data per sample, lab files and computed outcomes. A computed pass or fail supports, and never replaces, the customer's specification and the engineer's judgement."
        actions={
          can(user.roles, "evidence.record") ? (
            <IntentLink
              href="/evidence/runs/new"
              className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800"
            >
              New test run
            </IntentLink>
          ) : undefined
        }
      />
      <EvidenceTable families={options.families} recipes={options.recipes} />
    </>
  );
}
