import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { SystemEditor } from "@/components/systems/system-editor";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listSites } from "@/lib/server/systems/queries";
import { createSystemAction } from "../actions";

export const metadata: Metadata = { title: "New cleaning system" };

export default async function NewSystemPage() {
  await requirePageUser("systems.manage");
  const sites = await listSites();
  return (
    <>
      <PageHeader
        title="New cleaning system"
        description="A washer with its stages in process order and the equipment each carries. Recipes are written for it afterwards."
        actions={
          <IntentLink href="/systems" className="text-sm text-brand-800 hover:underline">
            Back to cleaning systems
          </IntentLink>
        }
      />
      <section className="rounded-lg border border-stone-200 bg-white p-5">
        <SystemEditor mode="create" action={createSystemAction} sites={sites} />
      </section>
    </>
  );
}
