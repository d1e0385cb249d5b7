import { auditEventSchema, type AuditEvent, type AuditEventType } from "./events";

type Stored = Record<string, unknown>;

interface LegacyName {
  /** The name the event has today. */
  now: AuditEventType;
  /** Renames keys of the stored old/new values to today's, when the rename reached the payload. */
  keys?: Record<string, string>;
}

/**
 * Event types stored under an earlier name. Stored events are hash-chained and
 * never rewritten, so the read side maps the old name (and any renamed payload
 * key) to today's; the stored text, and so the chain, stays as it was.
 */
export const LEGACY_EVENT_TYPES: Readonly<Record<string, LegacyName>> = {
  // A result row is a "sample" on every screen.
  "test_run.result_added": { now: "test_run.sample_added", keys: { resultId: "sampleId" } },
  "test_run.result_removed": { now: "test_run.sample_removed", keys: { resultId: "sampleId" } },
  // The record is a cleaning system, a cleanliness specification and a maintenance interval everywhere else;
  // "system" alone also read like the system actor.
  "system.created": { now: "cleaning_system.created" },
  "system.updated": { now: "cleaning_system.updated" },
  "spec.created": { now: "cleanliness_spec.created" },
  "maintenance.reminder_queued": { now: "maintenance_interval.reminder_queued" },
};

/** Today's name of a stored event type; unknown names are returned as they are. */
export function currentEventType(stored: string): string {
  return LEGACY_EVENT_TYPES[stored]?.now ?? stored;
}

/** Every name an event type was stored under, today's first: what a filter must match. */
export function storedNamesOf(eventType: string): string[] {
  const now = currentEventType(eventType);
  return [
    now,
    ...Object.entries(LEGACY_EVENT_TYPES)
      .filter(([, l]) => l.now === now)
      .map(([old]) => old),
  ];
}

/** The audit columns a reader needs (the table's own names). */
export interface StoredAuditRow {
  action: string;
  recordType: string;
  recordId: string;
  oldValue: string | null;
  newValue: string | null;
  reason: string | null;
}

/**
 * One stored event as a reader sees it. `event` is the typed event when the stored
 * row fits today's schema of its type; an event written before that schema took
 * its shape (or by a newer version) still reads, as plain values with
 * `event: null`, because the trail must show everything it holds.
 */
export type ReadAuditEvent = {
  eventType: string;
  /** The name in the stored row, which the hash covers. */
  storedAs: string;
  old: AuditEvent["old"] | Stored | null;
  new: AuditEvent["new"] | Stored | null;
  event: AuditEvent | null;
};

function parseValues(json: string | null, keys: Record<string, string> | undefined): Stored | null {
  if (json === null) return null;
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch {
    return { value: json };
  }
  if (typeof value !== "object" || value === null || Array.isArray(value)) return { value };
  if (!keys) return value as Stored;
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [keys[k] ?? k, v]));
}

export function readAuditEvent(row: StoredAuditRow): ReadAuditEvent {
  const legacy = LEGACY_EVENT_TYPES[row.action];
  const eventType = legacy?.now ?? row.action;
  const old = parseValues(row.oldValue, legacy?.keys);
  const next = parseValues(row.newValue, legacy?.keys);
  const parsed = auditEventSchema.safeParse({
    eventType,
    recordType: row.recordType,
    recordId: row.recordId,
    old,
    new: next,
    reason: row.reason,
  });
  if (parsed.success)
    return {
      eventType,
      storedAs: row.action,
      old: parsed.data.old,
      new: parsed.data.new,
      event: parsed.data,
    };
  return { eventType, storedAs: row.action, old, new: next, event: null };
}
