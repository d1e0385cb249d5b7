import { Caution } from "@/components/ui/caution";
import { STAGE_MODE_LABELS } from "@/lib/format/labels";
import { rangeWithUnit, withUnit } from "@/lib/format/number";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { hazardsOfStages } from "@/lib/recipes/hazards";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

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
      <Table density="compact" caption={caption} frameClassName="mt-4">
        <THead>
          <Th>Stage</Th>
          <Th>Parameter</Th>
          <Th align="right">Setpoint</Th>
          <Th>Validated range</Th>
          <Th>Critical</Th>
        </THead>
        <TBody>
          {content.stages.flatMap((stage, si) =>
            (stage.parameters.length ? stage.parameters : [null]).map((p, i) => (
              <tr key={`${si}-${p?.key ?? "none"}`}>
                <Td className="align-top">
                  {i === 0
                    ? `${stage.name}${stage.mode ? ` (${STAGE_MODE_LABELS[stage.mode] ?? stage.mode})` : ""}`
                    : ""}
                </Td>
                <Td>{p?.name ?? "—"}</Td>
                <Td numeric>{p ? withUnit(p.setpoint, p.unit) : ""}</Td>
                <Td className="tabular-nums">
                  {p ? rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit) : ""}
                </Td>
                <Td>{p ? (p.critical ? "Critical" : "—") : ""}</Td>
              </tr>
            )),
          )}
        </TBody>
      </Table>
    </>
  );
}
