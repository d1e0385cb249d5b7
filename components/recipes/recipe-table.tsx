import { Caution } from "@/components/ui/caution";
import { STAGE_MODE_LABELS } from "@/lib/format/labels";
import { rangeWithUnit, withUnit } from "@/lib/format/number";
import type { RecipeSnapshot } from "@/lib/recipes/diff";
import { hazardsOfStages } from "@/lib/recipes/hazards";

/** A recipe version as a lab record: stage, parameter, setpoint, validated range, critical — with its cautions first. */
export function RecipeTable({ content, caption }: { content: RecipeSnapshot; caption: string }) {
  const hazards = hazardsOfStages(content.stages);
  return (
    <>
      {hazards.length > 0 && (
        <div className="mt-3 space-y-2">
          {hazards.map((h) => (
            <Caution key={h.kind} title={h.title}>
              {h.text}
            </Caution>
          ))}
        </div>
      )}
      <table className="mt-4 w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-stone-200 text-left text-xs text-stone-500 uppercase">
          <tr>
            <th className="py-1.5 pr-3 font-medium">Stage</th>
            <th className="py-1.5 pr-3 font-medium">Parameter</th>
            <th className="py-1.5 pr-3 text-right font-medium">Setpoint</th>
            <th className="py-1.5 pr-3 font-medium">Validated range</th>
            <th className="py-1.5 font-medium">Critical</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-stone-100">
          {content.stages.flatMap((stage, si) =>
            (stage.parameters.length ? stage.parameters : [null]).map((p, i) => (
              <tr key={`${si}-${p?.key ?? "none"}`}>
                <td className="py-1.5 pr-3 align-top">{i === 0 ? `${stage.name}${stage.mode ? ` (${STAGE_MODE_LABELS[stage.mode] ?? stage.mode})` : ""}` : ""}</td>
                <td className="py-1.5 pr-3">{p?.name ?? "—"}</td>
                <td className="py-1.5 pr-3 text-right tabular-nums">{p ? withUnit(p.setpoint, p.unit) : ""}</td>
                <td className="py-1.5 pr-3 tabular-nums">{p ? rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit) : ""}</td>
                <td className="py-1.5">{p ? (p.critical ? "Critical" : "—") : ""}</td>
              </tr>
            )),
          )}
        </tbody>
      </table>
    </>
  );
}
