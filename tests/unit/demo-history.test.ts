import { and, eq, inArray, type SQL } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, changeRequests, requalificationMatrices } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { appendAudit, SYSTEM_ACTOR, verifyAuditChain } from "@/lib/audit";
import { asOf } from "@/lib/audit/seed-stamp";
import { createTestDatabase } from "./support/test-db";

// The demo's history: its 2025 events carry the times they describe and the people who acted,
// so an audit pack of the demo does not contradict its own signatures.

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const events = (where: SQL | undefined) =>
  t.db.select().from(auditEvents).where(where).orderBy(auditEvents.seq);

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
});
afterAll(() => t.cleanup());

describe("the demo's audit trail", () => {
  it("records CR-2025-001 on the days of its story, by the people who signed it", async () => {
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.number, "CR-2025-001"));
    const rows = await events(eq(auditEvents.recordId, cr.id));
    const step = (action: string) => rows.find((r) => r.action === action)!;
    expect(step("change.opened")).toMatchObject({
      at: "2025-08-12T08:30:00.000Z",
      actorName: "Ines Varga",
    });
    expect(step("change.impact_assessed")).toMatchObject({
      at: "2025-08-12T09:10:00.000Z",
      actorName: "Ines Varga",
    });
    expect(step("change.approved")).toMatchObject({
      at: "2025-08-14T13:45:00.000Z",
      actorName: "Helena Okafor",
    });
    expect(step("change.closed")).toMatchObject({
      at: "2025-09-01T07:00:00.000Z",
      actorName: "Helena Okafor",
    });
  });

  it("stamps each signature's event at the time the signature carries", async () => {
    const rows = await events(eq(auditEvents.action, "signature.applied"));
    expect(rows.length).toBeGreaterThan(10);
    for (const row of rows) expect(row.at).toBe(JSON.parse(row.newValue!).signedAt);
  });

  it("leaves to 'system' only what the system does by itself: reminders and the expiry job", async () => {
    const bySystem = await events(eq(auditEvents.actorName, SYSTEM_ACTOR.name));
    const byItself = [
      "maintenance_interval.reminder_queued",
      "requalification_interval.reminder_sent",
      "deviation.reminder_sent",
      "deviation.expired",
    ];
    expect(bySystem.map((r) => r.action).filter((a) => !byItself.includes(a))).toEqual([]);
  });

  it("dates the 2025 master data, recipe versions and runs in 2025", async () => {
    const rows = await events(
      inArray(auditEvents.action, [
        "part_family.created",
        "cleaning_system.created",
        "recipe_version.effective",
        "combination.qualified",
      ]),
    );
    // A version a change request put in force is dated by that change, not by the first year.
    const firstYear = rows.filter((r) => !JSON.parse(r.newValue!).changeRequest);
    expect(firstYear.length).toBeGreaterThan(10);
    for (const row of firstYear)
      expect(row.at < "2026-01-01", `${row.action} at ${row.at}`).toBe(true);
    const firstRun = await events(
      and(eq(auditEvents.action, "test_run.created"), eq(auditEvents.actorName, "Ravi Menon")),
    );
    expect(firstRun[0].at).toMatch(/^2025-/);
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
  });

  it("shows the matrix's version note in the plant's words, with no internal references", async () => {
    const [matrix] = await t.db.select().from(requalificationMatrices);
    expect(matrix.note).not.toMatch(/product\.md|issue|#\d/i);
  });
});

describe("outside the seed", () => {
  it("an event is stamped by the clock and the actor given, even as 'system'", async () => {
    const before = Date.now();
    const { seq } = await t.db.transaction((tx) =>
      appendAudit(tx, SYSTEM_ACTOR, {
        eventType: "site.created",
        recordType: "site",
        recordId: "s-after",
        new: { name: "Second site", location: null },
      }),
    );
    const [row] = await events(eq(auditEvents.seq, seq));
    expect(row.actorName).toBe("system");
    expect(new Date(row.at).getTime()).toBeGreaterThanOrEqual(before - 1000);
  });

  it("asOf replaces only the seed's 'system', never a person acting", async () => {
    const { seq } = await asOf("2025-02-01T10:00:00.000Z", { id: null, name: "Someone else" }, () =>
      t.db.transaction((tx) =>
        appendAudit(
          tx,
          { id: "u-1", name: "Ada Brook" },
          {
            eventType: "site.created",
            recordType: "site",
            recordId: "s-asof",
            new: { name: "Third site", location: null },
          },
        ),
      ),
    );
    const [row] = await events(eq(auditEvents.seq, seq));
    expect(row).toMatchObject({ actorName: "Ada Brook", at: "2025-02-01T10:00:00.000Z" });
  });
});
