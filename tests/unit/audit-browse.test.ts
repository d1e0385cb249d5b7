import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appendAudit } from "@/lib/audit";
import { describeChanges } from "@/lib/audit/describe";
import { toCsv } from "@/lib/csv/to-csv";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { iterateAuditEvents, queryAuditEvents } from "@/lib/server/audit/query-audit-events";
import { users } from "@/db/schema";
import { createTestDatabase } from "./support/test-db";

describe("describeChanges", () => {
  it("lists changed fields old → new in words and leaves unchanged ones out", () => {
    expect(
      describeChanges({ old: { name: "A", setpoint: 55 }, new: { name: "A", setpoint: 60 } }),
    ).toEqual([{ field: "setpoint", label: "Setpoint", old: "55", new: "60" }]);
    // A list reads as a list of words, not as JSON.
    expect(
      describeChanges({ old: null, new: { roles: ["engineer", "quality_approver"] } }),
    ).toEqual([{ field: "roles", label: "Roles", old: null, new: "Engineer; Quality approver" }]);
  });

  it("names the records an event refers to by number and name, not by id", () => {
    const labelOf = (type: string, id: string) =>
      type === "part_family" && id === "f-1" ? "PF-VB-210 · Valve body VB-210" : undefined;
    const changes = describeChanges(
      {
        old: null,
        new: {
          partFamilyId: "f-1",
          recipeVersionId: "v-unknown",
          effectiveFrom: "2025-03-10T07:00:00.000Z",
          testType: "uv_inspection",
          customerApprovesChanges: true,
          limits: { maxMetallicUm: 400 },
        },
      },
      labelOf,
    );
    expect(changes).toEqual([
      {
        field: "customerApprovesChanges",
        label: "Customer approves changes",
        old: null,
        new: "yes",
      },
      {
        field: "effectiveFrom",
        label: "Effective from",
        old: null,
        new: "2025-03-10 07:00:00 UTC",
      },
      { field: "limits", label: "Limits", old: null, new: "Max metallic µm: 400" },
      {
        field: "partFamilyId",
        label: "Part family",
        old: null,
        new: "PF-VB-210 · Valve body VB-210",
      },
      // A record that is no longer found keeps its id rather than vanishing.
      { field: "recipeVersionId", label: "Recipe version", old: null, new: "v-unknown" },
      { field: "testType", label: "Test type", old: null, new: "UV inspection" },
    ]);
  });

  it("shows a changed text as a word diff", () => {
    const [change] = describeChanges({
      old: { description: "Wash at 55 °C for 4 min" },
      new: { description: "Wash at 60 °C for 4 min" },
    });
    expect(change.words?.filter((w) => w.change !== null)).toEqual([
      { text: "55", change: "removed" },
      { text: "60", change: "added" },
    ]);
    expect(change.words?.map((w) => (w.change === "removed" ? "" : w.text)).join("")).toBe(
      "Wash at 60 °C for 4 min",
    );
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

  it("shows each event's record by its name, and ids in the values as names", async () => {
    await t.db.insert(users).values({
      id: "u-named",
      email: "named@example.test",
      name: "Nora Quill",
      passwordHash: "x",
    });
    await t.db.transaction((tx) =>
      appendAudit(
        tx,
        { id: "u-a", name: "Ann" },
        {
          eventType: "user.updated",
          recordType: "user",
          recordId: "u-named",
          old: { name: "Nora Q." },
          new: { name: "Nora Quill" },
        },
      ),
    );
    const [latest] = (await queryAuditEvents(auditQuerySchema.parse({ limit: "1" }))).items;
    expect(latest).toMatchObject({
      recordId: "u-named",
      recordLabel: "Nora Quill",
      recordTypeLabel: "User",
    });
    // An event on a record that is gone keeps its id and no label.
    const gone = await queryAuditEvents(auditQuerySchema.parse({ recordId: "r-3" }));
    expect(gone.items[0]).toMatchObject({ recordId: "r-3", recordLabel: null });
  });

  it("iterates every matching event for export", async () => {
    let count = 0;
    for await (const rows of iterateAuditEvents({ actor: "u-b" }, 4)) count += rows.length;
    expect(count).toBe(12);
  });
});
