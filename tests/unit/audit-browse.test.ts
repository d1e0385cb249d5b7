import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appendAudit } from "@/lib/audit";
import { describeChanges } from "@/lib/audit/describe";
import { toCsv } from "@/lib/csv/to-csv";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { iterateAuditEvents, queryAuditEvents } from "@/lib/server/audit/query-audit-events";
import { createTestDatabase } from "./support/test-db";

describe("describeChanges", () => {
  it("lists changed fields old → new and leaves unchanged ones out", () => {
    expect(
      describeChanges({ old: { name: "A", setpoint: 55 }, new: { name: "A", setpoint: 60 } }),
    ).toEqual([{ field: "setpoint", old: "55", new: "60" }]);
    expect(describeChanges({ old: null, new: { roles: ["engineer"] } })).toEqual([
      { field: "roles", old: null, new: '["engineer"]' },
    ]);
  });
});

describe("CSV export", () => {
  it("neutralises cells that a spreadsheet would run as formulas", () => {
    const csv = toCsv(
      ["a", "b"],
      [
        ['=HYPERLINK("x")', "+1"],
        ["-2", "@SUM(A1)"],
        ["plain", null],
      ],
    );
    const rows = Papa.parse<string[]>(csv).data;
    expect(rows[1]).toEqual(['\'=HYPERLINK("x")', "'+1"]);
    expect(rows[2]).toEqual(["'-2", "'@SUM(A1)"]);
    expect(rows[3]).toEqual(["plain", ""]);
  });
});

describe("audit query", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    t = await createTestDatabase();
    const actors = [
      { id: "u-a", name: "Ann" },
      { id: "u-b", name: "Bo" },
    ];
    for (let i = 0; i < 25; i++) {
      await t.db.transaction((tx) =>
        appendAudit(
          tx,
          actors[i % 2],
          i % 5 === 0
            ? {
                eventType: "user.created",
                recordType: "user",
                recordId: `r-${i}`,
                new: {
                  name: `User ${i}`,
                  email: `u${i}@example.test`,
                  jobTitle: null,
                  roles: ["engineer"],
                },
              }
            : {
                eventType: "user.updated",
                recordType: "user",
                recordId: `r-${i}`,
                old: { name: `Was ${i}` },
                new: { name: `User ${i}` },
              },
          new Date(Date.UTC(2026, 0, 1 + i)),
        ),
      );
    }
  });
  afterAll(() => t.cleanup());

  it("pages newest first with a keyset cursor and no overlap", async () => {
    const first = await queryAuditEvents(auditQuerySchema.parse({ limit: "10" }));
    expect(first.items.map((e) => e.seq)).toEqual([25, 24, 23, 22, 21, 20, 19, 18, 17, 16]);
    const second = await queryAuditEvents(
      auditQuerySchema.parse({ limit: "10", before: String(first.nextBefore) }),
    );
    expect(second.items[0].seq).toBe(15);
    const third = await queryAuditEvents(
      auditQuerySchema.parse({ limit: "10", before: String(second.nextBefore) }),
    );
    expect(third.items.map((e) => e.seq)).toEqual([5, 4, 3, 2, 1]);
    expect(third.nextBefore).toBeNull();
  });

  it("filters by user, event type and date range together", async () => {
    const page = await queryAuditEvents(
      auditQuerySchema.parse({
        actor: "u-a",
        eventType: "user.created",
        from: "2026-01-01",
        to: "2026-01-21",
      }),
    );
    // i = 0, 10, 20 are "created" by Ann (even i); their dates are Jan 1, 11 and 21.
    expect(page.items.map((e) => e.recordId)).toEqual(["r-20", "r-10", "r-0"]);
  });

  it("refuses unknown filters and a reversed date range", () => {
    expect(auditQuerySchema.safeParse({ colour: "red" }).success).toBe(false);
    expect(auditQuerySchema.safeParse({ from: "2026-02-01", to: "2026-01-01" }).success).toBe(
      false,
    );
    expect(auditQuerySchema.safeParse({ from: "01/02/2026" }).success).toBe(false);
  });

  it("treats SQL metacharacters in a filter as plain text", async () => {
    const page = await queryAuditEvents(auditQuerySchema.parse({ recordId: "r-1' OR '1'='1" }));
    expect(page.items).toEqual([]);
  });

  it("iterates every matching event for export", async () => {
    let count = 0;
    for await (const rows of iterateAuditEvents({ actor: "u-b" }, 4)) count += rows.length;
    expect(count).toBe(12);
  });
});
