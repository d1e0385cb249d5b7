import { IntentLink } from "@/components/ui/intent-link";
import { NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import { nonconformancesOfRun } from "@/lib/server/nonconformances/queries";

/** On a test run: the nonconformance its failure opened, and any whose containment holds it. */
export async function RunNonconformances({ runId }: { runId: string }) {
  const rows = await nonconformancesOfRun(runId);
  if (rows.length === 0) return null;
  return (
    <ul className="mb-4 space-y-1 rounded-md border border-stone-300 bg-stone-50 px-3 py-2 text-sm">
      {rows.map((nc) => (
        <li key={nc.id}>
          {nc.sourceId === runId
            ? "Nonconformance opened for this run: "
            : "In the containment of "}
          <IntentLink
            href={`/nonconformances/${nc.id}`}
            className="font-medium text-brand-800 underline"
          >
            {nc.number}
          </IntentLink>{" "}
          ({NC_STATUS_LABELS[nc.status].toLowerCase()})
        </li>
      ))}
    </ul>
  );
}
