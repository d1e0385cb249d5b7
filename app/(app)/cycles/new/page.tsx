import type { Metadata } from "next";
import { CycleForm } from "@/components/cycles/cycle-form";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { cycleFormOptions, effectiveCycleParameters } from "@/lib/server/cycles/queries";
import { recordCycleAction } from "../actions";

export const metadata: Metadata = { title: "Record a wash cycle" };

export default async function NewCyclePage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("evidence.record");
  const sp = await searchParams;
  const options = await cycleFormOptions();
  const chosen = options.recipes.find((r) => r.code === sp.recipe);
  const parameters = chosen ? await effectiveCycleParameters(chosen.code) : [];
  return (
    <>
      <PageHeader
        title="Record a wash cycle"
        description="For a cycle the washer did not log: the recipe version in force at its start is checked, and so is the part family's qualification on it."
      />
      <ListFilterForm
        label="Choose the recipe"
        action="/cycles/new"
        filters={[
          {
            name: "recipe",
            label: "Recipe",
            value: chosen?.code ?? "",
            options: options.recipes.map((r) => ({
              value: r.code,
              label: `${r.code} ${r.name} (${r.system})`,
            })),
          },
        ]}
      />
      {chosen ? (
        <CycleForm
          action={recordCycleAction}
          system={chosen.system}
          recipe={chosen.code}
          parameters={parameters}
          operator={user.name}
        />
      ) : (
        <p className="text-sm text-stone-700">
          Choose the recipe the cycle ran to see its value fields.
        </p>
      )}
    </>
  );
}
