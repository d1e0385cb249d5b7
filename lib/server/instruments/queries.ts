import "server-only";
import { and, asc, count, desc, eq, inArray, ne } from "drizzle-orm";
import type { z } from "zod";
import { getDb } from "@/db/client";
import {
  evidenceFiles,
  instrumentCalibrations,
  instruments,
  nonconformances,
  testRunInstruments,
  testRuns,
  users,
  type Instrument,
} from "@/db/schema";
import { todayUtc } from "@/lib/format/date";
import { dueState } from "@/lib/instruments/calibration";
import type { InstrumentKind, InstrumentStatus } from "@/lib/instruments/kinds";
import type { InstrumentOut, instrumentsQuery } from "@/lib/schemas/instrument-api";
import { after, page } from "@/lib/server/api/queries";

export const INSTRUMENT_PAGE_SIZE = 50;

/** One page of the register by asset number, with each entry's standing today. */
export async function listInstruments(
  q: { kind?: InstrumentKind; status?: InstrumentStatus; page: number },
  now = new Date(),
) {
  const db = getDb();
  const where = and(
    q.kind ? eq(instruments.kind, q.kind) : undefined,
    q.status ? eq(instruments.status, q.status) : undefined,
  );
  const [rows, [total]] = await Promise.all([
    db
      .select()
      .from(instruments)
      .where(where)
      .orderBy(asc(instruments.assetNumber))
      .limit(INSTRUMENT_PAGE_SIZE)
      .offset((q.page - 1) * INSTRUMENT_PAGE_SIZE),
    db.select({ n: count() }).from(instruments).where(where),
  ]);
  const today = todayUtc(now);
  return {
    rows: rows.map((r) => ({ ...r, state: dueState(r, today) })),
    total: total.n,
    pageSize: INSTRUMENT_PAGE_SIZE,
  };
}

/** An instrument's page: the entry, its calibrations newest first, and the runs that cited it lately. */
export async function getInstrumentDetail(instrumentId: string, now = new Date()) {
  const db = getDb();
  const [row] = await db.select().from(instruments).where(eq(instruments.id, instrumentId));
  if (!row) return undefined;
  const calibrations = await db
    .select({
      c: instrumentCalibrations,
      recordedBy: users.name,
      file: {
        id: evidenceFiles.id,
        name: evidenceFiles.originalName,
        sha256: evidenceFiles.sha256,
      },
      nc: { id: nonconformances.id, number: nonconformances.number },
    })
    .from(instrumentCalibrations)
    .leftJoin(users, eq(users.id, instrumentCalibrations.recordedBy))
    .leftJoin(evidenceFiles, eq(evidenceFiles.id, instrumentCalibrations.certificateFileId))
    .leftJoin(nonconformances, eq(nonconformances.id, instrumentCalibrations.nonconformanceId))
    .where(eq(instrumentCalibrations.instrumentId, row.id))
    .orderBy(desc(instrumentCalibrations.calibratedOn), desc(instrumentCalibrations.createdAt));
  const runs = await db
    .select({
      id: testRuns.id,
      number: testRuns.number,
      revision: testRuns.revision,
      status: testRuns.status,
      performedOn: testRuns.performedOn,
    })
    .from(testRunInstruments)
    .innerJoin(testRuns, eq(testRuns.id, testRunInstruments.runId))
    .where(and(eq(testRunInstruments.instrumentId, row.id), ne(testRuns.status, "superseded")))
    .orderBy(desc(testRuns.createdAt))
    .limit(20);
  return { instrument: row, state: dueState(row, todayUtc(now)), calibrations, runs };
}

/** What the run page offers to cite: every instrument in service, and those the run already cites. */
export async function instrumentsToCite(runId: string) {
  const db = getDb();
  const cited = await db
    .select({ id: testRunInstruments.instrumentId })
    .from(testRunInstruments)
    .where(eq(testRunInstruments.runId, runId));
  const citedIds = cited.map((c) => c.id);
  const rows = await db
    .select()
    .from(instruments)
    .where(eq(instruments.status, "in_service"))
    .orderBy(asc(instruments.assetNumber));
  const extra = citedIds.filter((id) => !rows.some((r) => r.id === id));
  const others = extra.length
    ? await db.select().from(instruments).where(inArray(instruments.id, extra))
    : [];
  return { options: [...rows, ...others], citedIds };
}

/** GET /api/v1/instruments. */
export async function listInstrumentsApi(q: z.output<typeof instrumentsQuery>, now = new Date()) {
  const db = getDb();
  const rows = await db
    .select()
    .from(instruments)
    .where(
      and(
        q.kind ? eq(instruments.kind, q.kind) : undefined,
        q.status ? eq(instruments.status, q.status) : undefined,
        after(instruments.assetNumber, instruments.id, q.cursor),
      ),
    )
    .orderBy(asc(instruments.assetNumber), asc(instruments.id))
    .limit(q.limit + 1);
  const out = page(rows, q.limit, (r) => [r.assetNumber, r.id]);
  const latest = await latestCalibrations(out.data.map((r) => r.id));
  const today = todayUtc(now);
  return {
    nextCursor: out.nextCursor,
    data: out.data.map((r: Instrument): InstrumentOut => ({
      id: r.id,
      assetNumber: r.assetNumber,
      kind: r.kind,
      description: r.description,
      location: r.location,
      range: r.range,
      resolution: r.resolution,
      status: r.status,
      statusReason: r.statusReason,
      calibrationIntervalMonths: r.calibrationIntervalMonths,
      expiresOn: r.expiresOn,
      dueOn: r.dueOn,
      dueState: dueState(r, today),
      lastCalibration: latest.get(r.id) ?? null,
    })),
  };
}

async function latestCalibrations(ids: string[]) {
  const map = new Map<string, NonNullable<InstrumentOut["lastCalibration"]>>();
  if (ids.length === 0) return map;
  const rows = await getDb()
    .select({
      instrumentId: instrumentCalibrations.instrumentId,
      calibratedOn: instrumentCalibrations.calibratedOn,
      dueOn: instrumentCalibrations.dueOn,
      result: instrumentCalibrations.result,
    })
    .from(instrumentCalibrations)
    .where(inArray(instrumentCalibrations.instrumentId, ids))
    .orderBy(asc(instrumentCalibrations.calibratedOn), asc(instrumentCalibrations.createdAt));
  for (const { instrumentId, ...c } of rows) map.set(instrumentId, c);
  return map;
}
