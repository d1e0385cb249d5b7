import type { Role } from "@/db/enums";
import { can } from "@/lib/auth/permissions";
import { listNonconformances } from "@/lib/server/nonconformances/queries";
import { NcTable } from "./nc-table";

/** The nonconformances of one recipe or part family, on its own page. */
export async function NcPanel({
  roles,
  where,
}: {
  roles: readonly Role[];
  where: { recipeId: string } | { partFamilyId: string };
}) {
  if (!can(roles, "nc.view")) return null;
  const rows = await listNonconformances(where);
  return (
    <section aria-labelledby="nonconformances" className="mt-8">
      <h2 id="nonconformances" className="mb-2 text-base font-semibold">
        Nonconformances
      </h2>
      <NcTable rows={rows} caption="Nonconformances" density="compact" empty="None recorded." />
    </section>
  );
}
