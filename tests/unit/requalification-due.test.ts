import { afterAll, beforeAll, describe, expect, it } from "vitest";
import dayjs from "dayjs";
import utc from "dayjs/plugin/utc";
import { sql } from "drizzle-orm";
import { seedDemo } from "@/db/seed";
import { requalificationDue, dueState } from "@/lib/changes/periodic";
import { changeQueueProvider } from "@/lib/server/changes/queue-provider";
import { dueRequalifications } from "@/lib/server/changes/due-requalifications";
import { getQueue } from "@/lib/server/queue/get-queue";
import { createTestDatabase } from "./support/test-db";

dayjs.extend(utc);

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
}, 120_000);
afterAll(() => t.cleanup());

describe("the stored requalification due date", () => {
  // Every day of six years (two leap years, every month's end) × intervals from 1 to 60 months, at
  // times of day down to the millisecond. Reference: dayjs's month arithmetic (npm, a general-purpose
  // date library), which also keeps the day of the month and clamps it to a shorter month's end.
  it("is the day-for-day date the interval later, clamped to the month's end: SQLite, our function and dayjs agree", async () => {
    // Only the dates matter here: the rows name no real recipe version or part family.
    await t.client.execute("pragma foreign_keys = off");
    await t.client.execute(`
      insert into requalification_intervals (id, recipe_version_id, part_family_id, interval_months, created_at, last_qualified_at)
      select 'due-' || d.n || '-' || m.months, 'v-' || d.n, 'f-' || m.months, m.months, '2023-01-01',
             strftime('%Y-%m-%dT%H:%M:%fZ', '2023-01-01', '+' || d.n || ' days',
                      '+' || (d.n * 7919 % 86400) || '.' || printf('%03d', d.n % 1000) || ' seconds')
      from (with recursive days(n) as (select 0 union all select n + 1 from days where n < 2190) select n from days) d,
           (select 1 as months union all select 2 union all select 3 union all select 6 union all select 11
            union all select 12 union all select 13 union all select 24 union all select 36 union all select 60) m`);
    const rows = await t.db.all<{ last: string; months: number; due: string }>(
      sql`select last_qualified_at as last, interval_months as months, due_at as due from requalification_intervals where id like 'due-%'`,
    );
    expect(rows).toHaveLength(2191 * 10);
    const mismatches = rows.filter(
      (r) =>
        r.due !== requalificationDue(r.last, r.months) ||
        r.due !== dayjs.utc(r.last).add(r.months, "month").toISOString(),
    );
    expect(mismatches.slice(0, 5)).toEqual([]);
    // Worked by hand: 31 January + 1 month is 29 February in a leap year.
    const jan31 = rows.find((r) => r.last.startsWith("2024-01-31") && r.months === 1)!;
    expect(jan31.due.slice(0, 10)).toBe("2024-02-29");
    expect(new Set(rows.map((r) => r.last.slice(11))).size).toBeGreaterThan(1000);
    await t.client.execute("delete from requalification_intervals where id like 'due-%'");
    await t.client.execute("pragma foreign_keys = on");
  });
});

describe("requalifications in My queue at plant scale", () => {
  const now = new Date("2026-12-03T12:00:00.000Z");
  const engineer = {
    id: "engineer-under-test",
    email: "engineer@fennmoor.example",
    name: "Engineer",
    roles: ["engineer" as const],
    mustChangePassword: false,
  };

  beforeAll(async () => {
    // 130 part families, each validated on the demo's first effective recipe version, last
    // qualified one day apart going back from ~11 months ago: some overdue, some due soon, some not.
    await t.client.execute(`
      insert into part_families (id, code, name, part_numbers, material, wetted_area_cm2, spec_id, created_at)
      select 'scale-family-' || n, 'PF-SCALE-' || printf('%03d', n), 'Scale family ' || n, '[]', f.material, f.wetted_area_cm2, f.spec_id, f.created_at
      from (with recursive s(n) as (select 1 union all select n + 1 from s where n < 130) select n from s),
           (select * from part_families order by code limit 1) f`);
    await t.client.execute(`
      insert into requalification_intervals (id, recipe_version_id, part_family_id, interval_months, created_at, last_qualified_at)
      select 'scale-' || printf('%03d', f.n), v.id, 'scale-family-' || f.n, 12, '2025-01-01',
             strftime('%Y-%m-%dT%H:%M:%fZ', '2025-12-03T09:30:00.000Z', (40 - f.n) || ' days')
      from (with recursive s(n) as (select 1 union all select n + 1 from s where n < 130) select n from s) f,
           (select id from recipe_versions where status = 'effective' order by id limit 1) v`);
  });

  // Reference: every effective combination's due date computed in JavaScript, as the queue did
  // before the date was stored, and sorted soonest first.
  async function expectedDue() {
    const rows = await t.db.all<{ id: string; last: string; months: number; status: string }>(
      sql`select ri.id, ri.last_qualified_at as last, ri.interval_months as months, v.status
          from requalification_intervals ri join recipe_versions v on v.id = ri.recipe_version_id`,
    );
    return rows
      .filter((r) => r.status === "effective")
      .map((r) => ({ id: r.id, due: requalificationDue(r.last, r.months) }))
      .map((r) => ({ ...r, state: dueState(r.due, now) }))
      .filter((r) => r.state !== "not_due")
      .sort((a, b) => a.due.localeCompare(b.due) || a.id.localeCompare(b.id));
  }

  it("selects the same combinations, soonest first, as computing every due date", async () => {
    const expected = await expectedDue();
    expect(expected.filter((e) => e.state === "overdue").length).toBeGreaterThan(50);
    expect(expected.filter((e) => e.state === "due_soon").length).toBeGreaterThan(20);
    const got = await dueRequalifications(t.db, now);
    expect(got.map((d) => [d.interval.id, d.due, d.state])).toEqual(
      expected.map((e) => [e.id, e.due, e.state]),
    );
  });

  it("counts each kind and pages it in SQL, in due-date order", async () => {
    const expected = await expectedDue();
    const overdue = expected.filter((e) => e.state === "overdue");
    const first = await getQueue(engineer as never, {}, now);
    expect(first.kinds).toContainEqual({ kind: "Requalification overdue", total: overdue.length });
    expect(first.kinds).toContainEqual({
      kind: "Requalification due",
      total: expected.length - overdue.length,
    });
    const shown = (page: typeof first) =>
      page.items.filter((i) => i.kind === "Requalification overdue").map((i) => i.id);
    expect(shown(first)).toEqual(overdue.slice(0, 50).map((e) => `requalification:${e.id}`));
    const second = await getQueue(
      engineer as never,
      { kind: "Requalification overdue", page: 2 },
      now,
    );
    expect(shown(second)).toEqual(overdue.slice(50, 100).map((e) => `requalification:${e.id}`));
    expect(second.items.every((i) => i.overdue)).toBe(true);
  });

  it("shows none to a technician, who cannot draft the change", async () => {
    const { items, totals } = await changeQueueProvider(
      { ...engineer, roles: ["technician" as const] } as never,
      now,
    );
    expect(items.some((i) => i.id.startsWith("requalification:"))).toBe(false);
    expect(totals?.["Requalification overdue"]).toBeUndefined();
  });
});
