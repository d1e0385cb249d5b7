import type { LabDetails } from "@/lib/schemas/lab-details";

export interface MethodPrefill {
  extraction?: Partial<LabDetails["extraction"]>;
  filter?: Partial<LabDetails["filter"]>;
  analysis?: Partial<LabDetails["analysis"]>;
}

type Cited = { kind: string; details: Record<string, unknown> };
const n = (v: unknown) => (typeof v === "number" ? v : undefined);
const s = (v: unknown) => (typeof v === "string" ? v : undefined);

/**
 * The run's lab details that repeat a cited method's fields, taken from the method: extraction
 * parameters from the extraction procedure, filter and analysis system from the analysis method
 * (or the filter from the gravimetric method when no analysis method is cited).
 */
export function labDetailsFromMethods(cited: readonly Cited[]): MethodPrefill {
  const out: MethodPrefill = {};
  const ex = cited.find((c) => c.kind === "extraction")?.details;
  const an = cited.find((c) => c.kind === "analysis")?.details;
  const gr = cited.find((c) => c.kind === "gravimetric")?.details;
  if (ex)
    out.extraction = {
      procedure: s(ex.procedure) as LabDetails["extraction"]["procedure"] | undefined,
      liquid: s(ex.liquid),
      volumeMl: n(ex.volumeMl),
      pressureBar: n(ex.pressureBar) ?? null,
      flowLPerMin: n(ex.flowLPerMin) ?? null,
      durationS: n(ex.durationS),
      controlledSurface: s(ex.controlledSurface),
      extractions: n(ex.extractions),
    };
  const filter = an ?? gr;
  if (filter) out.filter = { material: s(filter.filterMaterial), poreSizeUm: n(filter.poreSizeUm) };
  if (an)
    out.analysis = {
      system: s(an.system) as LabDetails["analysis"]["system"] | undefined,
      magnification: n(an.magnification),
      lowerSizeLimitUm: n(an.lowerSizeLimitUm),
    };
  return out;
}
