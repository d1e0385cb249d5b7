import type { TestType } from "@/db/enums";

const list = (counts: Record<string, number> | undefined) =>
  counts && Object.keys(counts).length
    ? Object.entries(counts)
        .map(([k, v]) => `${k} ${v}`)
        .join(", ")
    : "none";

/** One sample's raw data as a line of a lab record, each number with its unit. */
export function describeSample(testType: TestType, data: unknown): string {
  const d = (data ?? {}) as Record<string, unknown>;
  switch (testType) {
    case "particle_cleanliness": {
      const largest = (d.largest ?? {}) as Record<string, number | undefined>;
      const split = d.split as Record<string, Record<string, number>> | null | undefined;
      const parts = [
        `${d.components} component(s)`,
        `counts (particles): ${list(d.counts as Record<string, number>)}`,
      ];
      if (split)
        parts.push(
          `metallic ${list(split.metallic)}; non-metallic ${list(split.nonMetallic)}; fibres ${list(split.fibre)}`,
        );
      const big = [
        ["metallic", largest.metallicUm],
        ["non-metallic", largest.nonMetallicUm],
        ["fibre", largest.fibreUm],
      ].filter(([, v]) => v !== undefined);
      if (big.length) parts.push(`largest ${big.map(([t, v]) => `${t} ${v} µm`).join(", ")}`);
      return parts.join(" · ");
    }
    case "gravimetric":
      return `${d.components} component(s) · filter ${d.filterBeforeMg} mg before, ${d.filterAfterMg} mg after${d.blankMg !== undefined ? ` · blank ${d.blankMg} mg` : ""}`;
    case "wetting_tension":
      return `readings ${(d.readingsMNm as number[]).join(", ")} mN/m`;
    case "rinse_conductivity":
      return `${d.measuredUsPerCm} µS/cm at ${d.temperatureC} °C`;
    default:
      return `${d.acceptable ? "meets the criterion" : "does not meet the criterion"}${d.observation ? ` · ${d.observation}` : ""}`;
  }
}
