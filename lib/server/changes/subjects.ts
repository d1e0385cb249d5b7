import "server-only";
import { inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  changeRequestEquipment,
  changeRequestSpecs,
  cleaningSystems,
  cleanlinessSpecs,
} from "@/db/schema";
import type { MatrixRow } from "@/lib/changes/requalification";
import { assessEquipment, assessSpecification, type ChangeSubject } from "@/lib/changes/subjects";
import type { EquipmentStage } from "@/lib/plant/equipment";
import { compareSpecRevisions } from "@/lib/specs/compare";

/** The washer as it stood when an equipment change was opened. */
export interface EquipmentBefore {
  name: string;
  description: string | null;
  stages: (EquipmentStage & { id: string })[];
  /** The other effective recipes on the washer then: the same change touches them. */
  alsoRuns: string[];
}

/** The proposed washer: the system editor's input, every stage completed with its stored equipment. */
export interface EquipmentAfter {
  systemId: string;
  name: string;
  description: string | null;
  stages: (EquipmentStage & { id: string | null; kind: string })[];
}

/**
 * What each change request changes besides its recipe, assessed: the equipment diff of an
 * equipment change, the limit-by-limit comparison of a specification change. Two statements
 * for any number of change requests.
 */
export async function loadChangeSubjects(
  db: Executor,
  changeRequestIds: string[],
  matrix: MatrixRow[],
): Promise<Map<string, ChangeSubject>> {
  const out = new Map<string, ChangeSubject>();
  if (!changeRequestIds.length) return out;
  const equipment = await db
    .select()
    .from(changeRequestEquipment)
    .where(inArray(changeRequestEquipment.changeRequestId, changeRequestIds));
  if (equipment.length) {
    const systems = await db
      .select({ id: cleaningSystems.id, code: cleaningSystems.code })
      .from(cleaningSystems)
      .where(
        inArray(
          cleaningSystems.id,
          equipment.map((e) => e.systemId),
        ),
      );
    for (const e of equipment) {
      const before = e.before as EquipmentBefore;
      const after = e.after as EquipmentAfter;
      const { changes, assessment } = assessEquipment(before.stages, after.stages);
      out.set(e.changeRequestId, {
        kind: "equipment",
        system: systems.find((s) => s.id === e.systemId)?.code ?? "",
        alsoRuns: before.alsoRuns,
        changes,
        assessment,
      });
    }
  }
  const specLinks = await db
    .select()
    .from(changeRequestSpecs)
    .where(inArray(changeRequestSpecs.changeRequestId, changeRequestIds));
  if (specLinks.length) {
    const specs = await db
      .select()
      .from(cleanlinessSpecs)
      .where(
        inArray(
          cleanlinessSpecs.id,
          specLinks.flatMap((l) => [l.fromSpecId, l.toSpecId]),
        ),
      );
    for (const l of specLinks) {
      const from = specs.find((s) => s.id === l.fromSpecId)!;
      const to = specs.find((s) => s.id === l.toSpecId)!;
      const comparison = compareSpecRevisions(from, to);
      out.set(l.changeRequestId, {
        kind: "specification",
        spec: to.code,
        fromRevision: from.revision,
        toRevision: to.revision,
        changes: comparison.changes,
        assessment: assessSpecification(comparison, matrix),
      });
    }
  }
  return out;
}
