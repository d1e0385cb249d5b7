import "server-only";
import { and, asc, count, inArray, isNull, lte, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { instruments } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { todayUtc } from "@/lib/format/date";
import { addDays, DUE_SOON_DAYS, overdueSince, usesExpiry } from "@/lib/instruments/calibration";
import { INSTRUMENT_KIND_LABELS } from "@/lib/instruments/kinds";
import type { QueueProvider, QueueWindow } from "@/lib/server/queue/types";

export const CALIBRATION_KIND = "Calibration due";

const FIRST_PAGE = (): QueueWindow => ({ offset: 0, limit: 50 });

/**
 * Instruments whose calibration (or a test-ink set's expiry) falls within the month or has passed,
 * and those never calibrated, for the people who keep the register; paged in the database.
 */
export const instrumentQueueProvider: QueueProvider = async (user, now, window = FIRST_PAGE) => {
  if (!can(user.roles, "instrument.manage")) return { items: [] };
  const today = todayUtc(now);
  const where = and(
    inArray(instruments.status, ["in_service", "out_of_service"]),
    or(isNull(instruments.dueOn), lte(instruments.dueOn, addDays(today, DUE_SOON_DAYS))),
  );
  const { offset, limit } = window(CALIBRATION_KIND);
  const db = getDb();
  const [rows, [total]] = await Promise.all([
    db
      .select()
      .from(instruments)
      .where(where)
      .orderBy(
        sql`${instruments.dueOn} is null`,
        asc(instruments.dueOn),
        asc(instruments.assetNumber),
      )
      .limit(limit)
      .offset(offset),
    db.select({ n: count() }).from(instruments).where(where),
  ]);
  const items = rows.map((r) => {
    const ink = usesExpiry(r.kind);
    const detail = !r.dueOn
      ? ink
        ? "No expiry date recorded"
        : "No calibration on record: calibrate it before a run cites it"
      : r.dueOn < today
        ? `${ink ? "Expired" : "Overdue"} since ${overdueSince(r.dueOn)} (${ink ? "expiry" : "due"} ${r.dueOn})`
        : `${ink ? "Expires" : "Due"} ${r.dueOn}`;
    return {
      id: `calibration:${r.id}`,
      kind: CALIBRATION_KIND,
      title: `${r.assetNumber} · ${INSTRUMENT_KIND_LABELS[r.kind]}`,
      detail: `${detail}; ${r.location}`,
      href: `/instruments/${r.id}`,
      due: r.dueOn ? `${r.dueOn}T23:59:59.000Z` : null,
    };
  });
  return { items, totals: { [CALIBRATION_KIND]: total.n } };
};
