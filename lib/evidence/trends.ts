import { evaluateAgainstSpec, parseCleanlinessSpec, type Basis } from "@/lib/cleanliness";

export interface TrendRunInput {
  number: string;
  revision: number;
  performedOn: string | null;
  outcome: string | null;
  samples: { data: unknown }[];
}

export interface TrendSeries {
  /** One entry per limit of the specification, e.g. "B-D" or "E". */
  groups: { key: string; limit: number; limitLevel: string | null }[];
  unit: string;
  points: { run: string; date: string; outcome: string | null; values: Record<string, number> }[];
}

const UNIT = { area: "per 1000 cm²", volume: "per 100 cm³", component: "per component" } as const;

/**
 * Normalised counts over time per limit of the specification, worst sample of
 * each run, with the limit beside it; computed with evaluateAgainstSpec so the
 * chart and the run's outcome use the same arithmetic.
 */
export function particleTrend(
  ccc: string,
  family: { wettedAreaCm2: number; wettedVolumeCm3: number | null },
  runs: TrendRunInput[],
): TrendSeries {
  const spec = parseCleanlinessSpec(ccc);
  const groups = new Map<string, { key: string; limit: number; limitLevel: string | null }>();
  const points: TrendSeries["points"] = [];
  for (const run of runs) {
    const values: Record<string, number> = {};
    for (const sample of run.samples) {
      const data = sample.data as { components?: number; counts?: Record<string, number> };
      if (!data?.counts || !data.components) continue;
      const basis: Basis | null =
        spec.basis === "area"
          ? { kind: "area", totalAreaCm2: data.components * family.wettedAreaCm2 }
          : spec.basis === "volume"
            ? family.wettedVolumeCm3
              ? { kind: "volume", totalVolumeCm3: data.components * family.wettedVolumeCm3 }
              : null
            : { kind: "component", components: data.components };
      if (!basis) continue;
      for (const row of evaluateAgainstSpec(data.counts, basis, spec).rows) {
        const key =
          row.classes.length > 1
            ? `${row.classes[0]}-${row.classes[row.classes.length - 1]}`
            : row.classes[0];
        groups.set(key, { key, limit: row.limit, limitLevel: row.limitLevel ?? null });
        values[key] = Math.max(values[key] ?? 0, row.value);
      }
    }
    if (Object.keys(values).length > 0)
      points.push({
        run: `${run.number}${run.revision > 1 ? ` rev ${run.revision}` : ""}`,
        date: run.performedOn ?? "",
        outcome: run.outcome,
        values,
      });
  }
  return { groups: [...groups.values()], unit: UNIT[spec.basis], points };
}
