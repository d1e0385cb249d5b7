import { IntentLink } from "@/components/ui/intent-link";

export interface ListFilter {
  name: string;
  label: string;
  value: string;
  /** A choice list; without it the filter is a search box. */
  options?: { value: string; label: string }[];
}

/**
 * A server list's filters as a plain GET form: applying it puts the filters in the address, so
 * the filtered list can be linked, reloaded and shared, and it works before any script loads.
 */
export function ListFilterForm({
  label,
  action,
  filters,
}: {
  label: string;
  action: string;
  filters: ListFilter[];
}) {
  const control = "block w-full rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm";
  const active = filters.some((f) => f.value !== "");
  return (
    <form
      method="get"
      action={action}
      aria-label={label}
      className="mb-3 flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-3"
    >
      {filters.map((f) => (
        <label key={f.name} className="text-xs text-stone-600">
          {f.label}
          {f.options ? (
            <select name={f.name} defaultValue={f.value} className={control}>
              <option value="">All</option>
              {f.options.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          ) : (
            <input type="search" name={f.name} defaultValue={f.value} className={control} />
          )}
        </label>
      ))}
      <button
        type="submit"
        className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm font-medium hover:bg-stone-100"
      >
        Filter
      </button>
      {active && (
        <IntentLink href={action} className="px-1 py-1.5 text-sm text-brand-800 hover:underline">
          Clear filters
        </IntentLink>
      )}
    </form>
  );
}
