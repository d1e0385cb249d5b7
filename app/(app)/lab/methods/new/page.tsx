import type { Metadata } from "next";
import { MethodForm } from "@/components/lab-methods/method-form";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db/client";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { UserFacingError } from "@/lib/server/errors";
import { qualificationRuns } from "@/lib/server/lab-methods/queries";
import { loadMethod } from "@/lib/server/lab-methods/state";
import { draftMethodAction } from "../actions";

export const metadata: Metadata = { title: "New lab method" };

export default async function NewMethodPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  await requirePageUser("lab.method_draft");
  const { from } = await searchParams;
  const base =
    typeof from === "string" && /^[0-9a-f-]{36}$/.test(from)
      ? await loadMethod(getDb(), from).catch((error) => {
          if (error instanceof UserFacingError) return null;
          throw error;
        })
      : null;
  const runs = await qualificationRuns();
  return (
    <>
      <PageHeader
        title={base ? `New version of ${base.method.code}` : "New lab method"}
        description="Saved as a draft. An approver other than you signs it; then runs may cite it, and the version approved before it is superseded."
      />
      <MethodForm
        action={draftMethodAction}
        from={base ? base.method : null}
        runs={runs.map((r) => ({
          id: r.id,
          label: r.revision > 1 ? `${r.number} rev ${r.revision}` : r.number,
        }))}
      />
    </>
  );
}
