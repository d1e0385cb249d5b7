import { canonicalJson, sha256Hex } from "@/lib/audit";

/** A lab method version a run cites, as its hash covers it. */
export interface CitedMethodVersion {
  kind: string;
  methodId: string;
  code: string;
  version: number;
}

export interface HashableRun {
  number: string;
  revision: number;
  partFamilyId: string;
  recipeVersionId: string;
  testType: string;
  technicianId: string | null;
  lab: string | null;
  performedOn: string | null;
  changeRequestId: string | null;
  protocolDocumentId: string | null;
  requirement: string | null;
  runData: unknown;
}

/**
 * Exactly what a signature on a run covers: the run's identity and context, its
 * raw data and the hashes of its files. Status is left out, so the "performed"
 * signature stays valid when the run is verified; any change to data or files
 * changes the hash and shows the signature as no longer valid. The lab details (extraction,
 * filter, analysis, component data) and the instruments used are part of the content once recorded.
 */
export function runContentHash(
  run: HashableRun,
  samples: {
    sampleLabel: string;
    cycleNumber?: string | null;
    basketPosition: string | null;
    worstCase: boolean;
    data: unknown;
  }[],
  files: { sha256: string; originalName: string; kind: string; sampleLabel: string | null }[],
  labDetails: unknown = null,
  instruments: readonly string[] = [],
  methods: readonly CitedMethodVersion[] = [],
) {
  const content: Record<string, unknown> = {
    number: run.number,
    revision: run.revision,
    partFamilyId: run.partFamilyId,
    recipeVersionId: run.recipeVersionId,
    testType: run.testType,
    technicianId: run.technicianId,
    lab: run.lab,
    performedOn: run.performedOn,
    changeRequestId: run.changeRequestId,
    protocolDocumentId: run.protocolDocumentId,
    requirement: run.requirement,
    runData: run.runData ?? null,
    // The key stays "results": every signature already given binds to content hashed under it.
    results: samples.map((r) => ({
      sampleLabel: r.sampleLabel,
      // Only when named: content signed before samples named their cycle hashes as it did.
      ...(r.cycleNumber ? { cycleNumber: r.cycleNumber } : {}),
      basketPosition: r.basketPosition,
      worstCase: r.worstCase,
      data: r.data,
    })),
    files: files.map((f) => ({
      sha256: f.sha256,
      name: f.originalName,
      kind: f.kind,
      sampleLabel: f.sampleLabel,
    })),
  };
  // Only a run with lab details carries the key, so every signature given before they existed still binds.
  if (labDetails !== null) content.labDetails = labDetails;
  // The instruments cited (asset numbers, sorted); only when some are, for the same reason.
  if (instruments.length > 0) content.instruments = [...instruments].sort();
  // Likewise the method versions cited: only a run that cites one carries the key.
  if (methods.length > 0)
    content.methods = [...methods]
      .sort((a, b) => a.kind.localeCompare(b.kind))
      .map((m) => ({ kind: m.kind, methodId: m.methodId, code: m.code, version: m.version }));
  return { content, hash: sha256Hex(canonicalJson(content)) };
}
