import type { LabMethodKind } from "@/db/enums";
import { formatNumber, withUnit } from "@/lib/format/number";
import { ANALYSIS_SYSTEM_LABELS, EXTRACTION_PROCEDURE_LABELS } from "@/lib/schemas/lab-details";
import { PARTICLE_DISTINCTION_LABELS, type ParticleDistinction } from "./rules";

type Row = [string, string];
const num = (v: unknown, unit: string) => (typeof v === "number" ? withUnit(v, unit) : "—");

/** A method version's fields as label and value, each number with its unit. */
export function describeMethod(kind: LabMethodKind, details: Record<string, unknown>): Row[] {
  const d = details;
  if (kind === "extraction")
    return [
      [
        "Procedure",
        EXTRACTION_PROCEDURE_LABELS[d.procedure as keyof typeof EXTRACTION_PROCEDURE_LABELS] ?? "—",
      ],
      ["Extraction liquid", String(d.liquid ?? "—")],
      ["Liquid volume", num(d.volumeMl, "mL")],
      ["Pressure", num(d.pressureBar, "bar")],
      ["Flow", num(d.flowLPerMin, "L/min")],
      ["Extraction time", num(d.durationS, "s")],
      ["Controlled surface", String(d.controlledSurface ?? "—")],
      ["Number of extractions", String(d.extractions ?? "—")],
    ];
  const filter: Row[] = [
    ["Filter membrane", String(d.filterMaterial ?? "—")],
    ["Pore size", num(d.poreSizeUm, "µm")],
  ];
  if (kind === "analysis")
    return [
      ...filter,
      [
        "Analysis system",
        ANALYSIS_SYSTEM_LABELS[d.system as keyof typeof ANALYSIS_SYSTEM_LABELS] ?? "—",
      ],
      [
        "Magnification",
        typeof d.magnification === "number" ? `${formatNumber(d.magnification, 0)}×` : "—",
      ],
      ["Lower size limit", num(d.lowerSizeLimitUm, "µm")],
      [
        "Tells apart",
        ((d.distinguishes as ParticleDistinction[] | undefined) ?? [])
          .map((p) => PARTICLE_DISTINCTION_LABELS[p])
          .join(", ") || "—",
      ],
    ];
  return [
    ...filter,
    ["Balance resolution", num(d.balanceResolutionMg, "mg")],
    ["Drying", `${num(d.dryingTemperatureC, "°C")} for ${num(d.dryingTimeMin, "min")}`],
    ["Weighing conditions", String(d.weighingConditions ?? "—")],
    ["Practical lower limit", num(d.practicalLowerLimitMg, "mg")],
    ["Pooling rule", String(d.poolingRule ?? "—")],
  ];
}
