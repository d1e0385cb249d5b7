import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { hasChangeRequests, listChangeRequests } from "@/lib/server/changes/queries";
import { LIST_PAGE_SIZE } from "@/lib/server/list-query";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const COPIES = 40;
let demo: Awaited<ReturnType<typeof listChangeRequests>>;

/** Every column of a table, with some replaced by expressions over the copy number `n`. */
async function copyColumns(table: string, replaced: Record<string, string>) {
  const columns = (await t.client.execute(`pragma table_info(${table})`)).rows.map((r) =>
    String(r.name),
  );
  return {
    names: columns.join(", "),
    values: columns.map((c) => replaced[c] ?? c).join(", "),
  };
}

beforeAll(async () => {
  t = await createTestDatabase();
  expect(await hasChangeRequests()).toBe(false);
  await seedDemo(t.db);
  demo = await listChangeRequests();
  // A plant's history: each demo change copied 40 times, as closed changes of other years.
  const cr = await copyColumns("change_requests", {
    id: `'copy-' || n || '-' || id`,
    number: `number || '/' || n`,
    status: `'closed'`,
    created_at: `'2019-01-01T00:00:00.000Z'`,
  });
  const seq = `(with recursive seq(n) as (select 1 union all select n + 1 from seq where n < ${COPIES}) select n from seq)`;
  await t.client.execute(
    `insert into change_requests (${cr.names}) select ${cr.values} from change_requests, ${seq}`,
  );
  const a = await copyColumns("change_request_assessments", {
    change_request_id: `'copy-' || n || '-' || change_request_id`,
  });
  await t.client.execute(
    `insert into change_request_assessments (${a.names}) select ${a.values} from change_request_assessments, ${seq} where change_request_id not like 'copy-%'`,
  );
}, 60_000);
afterAll(() => t.cleanup());

describe("the change list at plant size", () => {
  it("pages changes newest first, fifty at a time, with the count of everything that matches", async () => {
    const first = await listChangeRequests();
    expect(first.total).toBe(demo.total * (COPIES + 1));
    expect(first.rows).toHaveLength(LIST_PAGE_SIZE);
    // The demo's own changes are the newest.
    expect(first.rows.slice(0, demo.total).map((r) => r.id)).toEqual(demo.rows.map((r) => r.id));
    const seen = new Set<string>();
    for (let page = 1; page <= first.pages; page++)
      for (const r of (await listChangeRequests({ page })).rows) seen.add(r.id);
    expect(seen.size).toBe(first.total);
    const dates = first.rows.map((r) => r.createdAt);
    expect(dates).toEqual([...dates].sort().reverse());
  });

  it("filters on status and kind, and needs every search word in the number, title, recipe or author", async () => {
    const closed = await listChangeRequests({ status: "closed" });
    expect(closed.total).toBeGreaterThanOrEqual(demo.total * COPIES);
    expect(closed.rows.every((r) => r.status === "closed")).toBe(true);
    const [sample] = demo.rows;
    const byKind = await listChangeRequests({ kind: sample.kind });
    expect(byKind.rows.every((r) => r.kind === sample.kind)).toBe(true);
    const words = `${sample.recipeCode.toLowerCase()} ${sample.author.split(" ")[0].toUpperCase()}`;
    const found = await listChangeRequests({ q: words });
    expect(found.total).toBeGreaterThan(0);
    expect(
      found.rows.every((r) => r.recipeCode === sample.recipeCode && r.author === sample.author),
    ).toBe(true);
    expect((await listChangeRequests({ q: `${sample.number} no-such-word` })).total).toBe(0);
    expect((await listChangeRequests({ q: "%" })).total).toBe(0);
  });

  it("finds an open emergency change by the word it shows, and a closed one no longer", async () => {
    const emergencies = demo.rows.filter((r) => r.emergencyAt !== null);
    expect(emergencies.length).toBeGreaterThan(0);
    const shown = await listChangeRequests({ q: "emergency" });
    expect(shown.total).toBeGreaterThan(0);
    for (const r of emergencies.filter(
      (r) => !["closed", "rejected", "withdrawn"].includes(r.status),
    ))
      expect(shown.rows.map((x) => x.id)).toContain(r.id);
    expect(shown.rows.every((r) => r.emergencyAt !== null || /emergency/i.test(r.title))).toBe(
      true,
    );
    expect(shown.rows.some((r) => r.id.startsWith("copy-") && !/emergency/i.test(r.title))).toBe(
      false,
    );
  });

  it("answers a page past the end with the last page", async () => {
    const last = await listChangeRequests({ page: 10_000 });
    expect(last.page).toBe(last.pages);
    expect(last.rows.length).toBe(last.total - (last.pages - 1) * LIST_PAGE_SIZE);
  });
});
