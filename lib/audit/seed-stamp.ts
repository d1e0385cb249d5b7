import { AsyncLocalStorage } from "node:async_hooks";
import type { AuditActor } from "./events";

interface Stamp {
  at: Date;
  actor: AuditActor | null;
}

const stamp = new AsyncLocalStorage<Stamp>();

/**
 * For the demo seed only: the audit events written inside `fn` carry the time the story
 * describes and, where a service was called as "system", the person who acted — so a demo
 * loaded today still shows its 2025 approvals on their 2025 days, signed by their people.
 * A running plant never calls this: its events are stamped by the clock and the signed-in user.
 */
export function asOf<T>(
  at: string | Date,
  actor: AuditActor | null,
  fn: () => Promise<T>,
): Promise<T> {
  const when = new Date(at);
  if (Number.isNaN(when.getTime())) throw new Error(`asOf: not a time: ${String(at)}`);
  return stamp.run({ at: when, actor }, fn);
}

/** The stamp asOf() set for the current seed step, if any. */
export function seedStamp(): Stamp | undefined {
  return stamp.getStore();
}
