import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { RecipeCsvImport } from "@/components/recipes/recipe-csv-import";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getCleaningSystem } from "@/lib/server/plant/queries";

export const metadata: Metadata = { title: "Import a recipe" };

export default async function ImportRecipePage({
  params,
}: {
  params: Promise<{ systemId: string }>;
}) {
  await requirePageUser("recipe.edit");
  const { systemId } = await params;
  const system = /^[0-9a-f-]{36}$/.test(systemId) ? await getCleaningSystem(systemId) : undefined;
  if (!system) notFound();
  return (
    <>
      <PageHeader
        title={`Import a recipe for ${system.code}`}
        description={
          <>
            On{" "}
            <IntentLink href={`/systems/${system.id}`} className="text-brand-800 hover:underline">
              {system.code} {system.name}
            </IntentLink>
            . The file&apos;s stages and parameters are checked as the recipe form checks them and
            saved as a draft first version, all of it or nothing; it runs parts only after its
            initial validation is closed. Or{" "}
            <IntentLink
              href={`/systems/${system.id}/recipes/new`}
              className="text-brand-800 hover:underline"
            >
              type the recipe in
            </IntentLink>
            .
          </>
        }
      />
      {system.active ? (
        <RecipeCsvImport systemId={system.id} />
      ) : (
        <p className="text-sm text-stone-700">
          {system.code} is retired: recipes are written for systems in use.
        </p>
      )}
    </>
  );
}
