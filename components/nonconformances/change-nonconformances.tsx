import { IntentLink } from "@/components/ui/intent-link";
import { NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import { nonconformancesOfChange } from "@/lib/server/nonconformances/queries";

/** On a change request: the nonconformances whose corrective actions it carries out. */
export async function ChangeNonconformances({ changeRequestId }: { changeRequestId: string }) {
  const rows = await nonconformancesOfChange(changeRequestId);
  if (rows.length === 0) return null;
  return (
    <p className="mb-6 rounded-md border border-stone-200 bg-stone-50 px-4 py-3 text-sm">
      Corrective action of{" "}
      {rows.map((nc, i) => (
        <span key={nc.id}>
          {i > 0 && ", "}
          <IntentLink
            href={`/nonconformances/${nc.id}`}
            className="font-medium text-brand-800 underline"
          >
            {nc.number}
          </IntentLink>{" "}
          ({nc.title}; {NC_STATUS_LABELS[nc.status].toLowerCase()})
        </span>
      ))}
      .
    </p>
  );
}
