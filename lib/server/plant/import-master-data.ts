import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { cleanlinessSpecs } from "@/db/schema";
import type { AuditActor } from "@/lib/audit";
import type { PartFamilyRow, SpecRow } from "@/lib/plant/csv-master-data";
import { UserFacingError } from "@/lib/server/errors";
import { createPartFamilyIn } from "./create-part-family";
import { createSpecIn } from "./create-spec";

export type RowProblem = { line: number; message: string };

export type MasterDataImport =
  { kind: "part_families"; rows: PartFamilyRow[] } | { kind: "specifications"; rows: SpecRow[] };

export type MasterDataImportResult =
  { ok: true; imported: number } | { ok: false; errors: RowProblem[] };

class RowsRefused extends Error {
  constructor(readonly errors: RowProblem[]) {
    super("rows refused");
  }
}

async function specIdFor(tx: Tx, code: string) {
  const [spec] = await tx
    .select({ id: cleanlinessSpecs.id })
    .from(cleanlinessSpecs)
    .where(and(eq(cleanlinessSpecs.code, code), eq(cleanlinessSpecs.status, "in_force")));
  if (!spec)
    throw new UserFacingError(
      `No specification ${code} is in force: register it first, or import the specifications file before the families.`,
    );
  return spec.id;
}

/**
 * Saves rows the CSV parser accepted through the same services as the entry forms, so each row is
 * checked for clashes and audited exactly as if typed. One transaction: a row the database refuses
 * (a code already in the register) rolls back every row, and each refusal is reported by line.
 */
export async function importMasterData(
  actor: AuditActor,
  input: MasterDataImport,
): Promise<MasterDataImportResult> {
  try {
    await getDb().transaction(async (tx) => {
      const errors: RowProblem[] = [];
      for (const [i, row] of input.rows.entries()) {
        const line = i + 2; // the header is line 1
        try {
          if (input.kind === "specifications") {
            await createSpecIn(tx, actor, row as SpecRow);
          } else {
            const { specCode, ...family } = row as PartFamilyRow;
            await createPartFamilyIn(tx, actor, {
              ...family,
              specId: await specIdFor(tx, specCode),
            });
          }
        } catch (error) {
          if (!(error instanceof UserFacingError)) throw error;
          errors.push({ line, message: error.message });
        }
      }
      if (errors.length) throw new RowsRefused(errors);
    });
  } catch (error) {
    if (error instanceof RowsRefused) return { ok: false, errors: error.errors };
    throw error;
  }
  return { ok: true, imported: input.rows.length };
}
