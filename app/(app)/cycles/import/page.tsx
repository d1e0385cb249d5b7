import type { Metadata } from "next";
import { CycleImport } from "@/components/cycles/cycle-import";
import { PageHeader } from "@/components/ui/page-header";
import { CYCLE_FIELDS, valueFields } from "@/lib/cycles/csv";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { cycleValueParameters } from "@/lib/server/cycles/queries";

export const metadata: Metadata = { title: "Import a cycle log" };

export default async function ImportCyclesPage() {
  await requirePageUser("evidence.record");
  const fields = [...CYCLE_FIELDS, ...valueFields(await cycleValueParameters())];
  return (
    <>
      <PageHeader
        title="Import a cycle log"
        description="A washer's cycle log as CSV: each row is checked against the recipe version in force at its start and the part family's qualification; values outside their validated range flag the cycle."
      />
      <CycleImport fields={fields} />
    </>
  );
}
