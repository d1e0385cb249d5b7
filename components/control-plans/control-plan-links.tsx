import { IntentLink } from "@/components/ui/intent-link";

/** The control plans of a recipe version or a part family, linked from its page. */
export function ControlPlanLinks({
  plans,
  none,
}: {
  plans: { id: string; name: string }[];
  none: string;
}) {
  return (
    <section aria-labelledby="control-plans" className="mt-6">
      <h2 id="control-plans" className="mb-1 text-lg font-semibold">
        Control plans
      </h2>
      {plans.length === 0 ? (
        <p className="text-sm text-stone-600">{none}</p>
      ) : (
        <ul className="list-disc pl-5 text-sm">
          {plans.map((p) => (
            <li key={p.id}>
              <IntentLink href={`/control-plans/${p.id}`} className="text-brand-800 underline">
                Control plan {p.name}
              </IntentLink>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
