import type { Metadata } from "next";
import { NewNcForm } from "@/components/nonconformances/nc-forms";
import { PageHeader } from "@/components/ui/page-header";
import { todayUtc } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { ncFormChoices } from "@/lib/server/nonconformances/queries";

export const metadata: Metadata = { title: "Report a nonconformance" };

export default async function NewNonconformancePage() {
  await requirePageUser("nc.open");
  const choices = await ncFormChoices();
  return (
    <>
      <PageHeader
        title="Report a nonconformance"
        description="A customer complaint, a field return or an audit finding. Failed test runs open their own."
      />
      <NewNcForm today={todayUtc()} {...choices} />
    </>
  );
}
