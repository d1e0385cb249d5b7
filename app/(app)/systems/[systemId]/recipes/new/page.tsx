import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { NewRecipeForm } from "@/components/recipes/new-recipe-form";
import type { StageDraft } from "@/components/recipes/recipe-stages-editor";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getCleaningSystem } from "@/lib/server/plant/queries";
import { createRecipeAction } from "./actions";

export const metadata: Metadata = { title: "New recipe" };

export default async function NewRecipePage({ params }: { params: Promise<{ systemId: string }> }) {
  await requirePageUser("recipe.edit");
  const { systemId } = await params;
  const system = /^[0-9a-f-]{36}$/.test(systemId) ? await getCleaningSystem(systemId) : undefined;
  if (!system) notFound();
  // The washer's own stages, in its order, each with the first mode it can run: the engineer adjusts from there.
  const stages = system.stages.map((s) => ({
    name: s.name,
    kind: s.kind,
    mode: (s.capabilities[0] ?? "") as StageDraft["mode"],
  }));
  return (
    <>
      <PageHeader
        title={`New recipe for ${system.code}`}
        description={
          <>
            On{" "}
            <IntentLink href={`/systems/${system.id}`} className="text-brand-800 hover:underline">
              {system.code} {system.name}
            </IntentLink>
            . The recipe is saved as a draft first version; it runs parts only after its initial
            validation is closed. A recipe kept in a spreadsheet can be{" "}
            <IntentLink
              href={`/systems/${system.id}/recipes/import`}
              className="text-brand-800 hover:underline"
            >
              imported from CSV
            </IntentLink>
            .
          </>
        }
      />
      {system.active ? (
        <NewRecipeForm action={createRecipeAction} systemId={system.id} stages={stages} />
      ) : (
        <p className="text-sm text-stone-700">
          {system.code} is retired: recipes are written for systems in use.
        </p>
      )}
    </>
  );
}
