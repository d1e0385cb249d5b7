import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { instruments, type Instrument } from "@/db/schema";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/kinds";
import { notFoundError, UserFacingError } from "@/lib/server/errors";

export async function loadInstrument(db: Executor, instrumentId: string, field = "instrumentId") {
  const [row] = await db.select().from(instruments).where(eq(instruments.id, instrumentId));
  if (!row) throw notFoundError("That instrument is not in the register.", field);
  return row;
}

/** A retired instrument's record is closed: nothing more is recorded on it. */
export function assertNotRetired(row: Instrument) {
  if (row.status === "retired")
    throw new UserFacingError(`${row.assetNumber} is retired; its record is closed.`, {
      kind: "conflict",
    });
}

/** "Balance BAL-01 (Analytical balance)": how messages and e-mails name an instrument. */
export const instrumentName = (row: Pick<Instrument, "kind" | "assetNumber" | "description">) =>
  `${INSTRUMENT_KIND_LABELS[row.kind]} ${row.assetNumber} (${row.description})`;

/** The register entry as its audit events record it. */
export function instrumentDetails(row: Instrument) {
  return {
    assetNumber: row.assetNumber,
    kind: row.kind,
    description: row.description,
    location: row.location,
    range: row.range,
    resolution: row.resolution,
    status: row.status,
    statusReason: row.statusReason,
    calibrationIntervalMonths: row.calibrationIntervalMonths,
    expiresOn: row.expiresOn,
  };
}

/** Refuses an asset number another entry already carries, beside the field. */
export async function assertAssetNumberFree(db: Executor, assetNumber: string, exceptId?: string) {
  const [twin] = await db
    .select({ id: instruments.id })
    .from(instruments)
    .where(eq(instruments.assetNumber, assetNumber));
  if (twin && twin.id !== exceptId)
    throw new UserFacingError(`Asset number ${assetNumber} is already in the register.`, {
      kind: "conflict",
      field: "assetNumber",
    });
}
