import { canonicalJson, sha256Hex } from "@/lib/audit";

/** What the closure signatures bind to: the record as the signers saw it. */
export interface NcContent {
  number: string;
  title: string;
  description: string;
  severity: string;
  source: { kind: string; id: string | null; label: string; manualKind: string | null };
  detectedOn: string;
  causeMethod: string | null;
  rootCause: unknown;
  items: { id: string; hold: string; disposition: string | null; reference: string | null }[];
  actions: {
    id: string;
    kind: string;
    description: string;
    status: string;
    evidence: string | null;
  }[];
  effectiveness: {
    criterion: string | null;
    result: string | null;
    runId: string | null;
    fileId: string | null;
  };
}

export function ncContentHash(content: NcContent): string {
  return sha256Hex(canonicalJson(content as unknown as Record<string, unknown>));
}
