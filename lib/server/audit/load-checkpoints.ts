import "server-only";
import { parseCheckpoint, type SignedCheckpoint } from "@/lib/audit/checkpoint";
import { getCheckpointStore } from "@/lib/storage/checkpoints";

/**
 * Every checkpoint in the evidence store, oldest event first, and the names of files
 * that are not checkpoints. `newestOnly` reads just the last one: a rewrite re-chained
 * from any earlier event changes the hash the newest checkpoint holds, so it alone
 * detects one (the older ones narrow down where it lies).
 */
export async function loadCheckpoints(
  options: { newestOnly?: boolean } = {},
): Promise<{ checkpoints: SignedCheckpoint[]; unreadable: string[] }> {
  const store = getCheckpointStore();
  const all = await store.list();
  const names = options.newestOnly ? all.slice(-1) : all;
  const checkpoints: SignedCheckpoint[] = [];
  const unreadable: string[] = [];
  // Read a few at a time: a year of hourly checkpoints is thousands of small files.
  for (let i = 0; i < names.length; i += 16) {
    const texts = await Promise.all(names.slice(i, i + 16).map((n) => store.read(n)));
    texts.forEach((text, j) => {
      const cp = text === null ? null : parseCheckpoint(text);
      if (cp) checkpoints.push(cp);
      else unreadable.push(names[i + j]);
    });
  }
  checkpoints.sort((a, b) => a.seq - b.seq || a.at.localeCompare(b.at));
  return { checkpoints, unreadable };
}
