import type { DocumentType } from "@/db/enums";

/** What a template knows about the process it is written for; any link may be missing. */
export interface TemplateContext {
  type: DocumentType;
  number: string;
  title: string;
  system: { code: string; name: string; stages: string[] } | null;
  partFamily: {
    code: string;
    name: string;
    material: string;
    wettedAreaCm2: number;
    spec: {
      code: string;
      ccc: string;
      maxMetallicUm: number | null;
      maxNonMetallicUm: number | null;
      maxFibreUm: number | null;
      gravimetricLimitMg: number | null;
      gravimetricBasis: "per_component" | "per_1000_cm2" | null;
      minWettingTensionMNm: number | null;
      visualCriteria: string | null;
      drynessCriteria: string | null;
    };
  } | null;
  recipe: {
    code: string;
    name: string;
    version: number;
    parameters: {
      name: string;
      setpoint: number;
      unit: string;
      low: number | null;
      high: number | null;
    }[];
  } | null;
  sample: { confidencePct: number; reliabilityPct: number; size: number };
  /** The test runs on this part family and recipe version (a report's results), oldest first. */
  runs?: {
    number: string;
    testType: string;
    samples: number;
    outcome: "pass" | "fail" | "incomplete" | null;
    status: string;
    performedOn: string | null;
    technician: string | null;
  }[];
}
