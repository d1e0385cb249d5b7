import fc from "fast-check";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { appendAudit, verifyAuditChain, canonicalJson } from "@/lib/audit";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const actor = { id: "u-1", name: "Test Engineer" };

async function appendMany(n: number) {
  for (let i = 0; i < n; i++) {
    await t.db.transaction((tx) =>
      appendAudit(tx, actor, {
        eventType: "user.updated",
        recordType: "user",
        recordId: `r-${i}`,
        old: { name: `n${i}` },
        new: { name: `n${i + 1}` },
        reason: "test",
      }),
    );
  }
}

/**
 * Verifies with the default page and with pages of one to three rows, so the
 * page-wise check on SQLite's text and the row-by-row path must agree.
 */
async function verify() {
  const results = await Promise.all(
    [undefined, 1, 2, 3].map((page) => verifyAuditChain(t.db, { page })),
  );
  for (const r of results.slice(1)) expect(r).toEqual(results[0]);
  return results[0];
}

beforeEach(async () => {
  t = await createTestDatabase();
});
afterEach(() => t.cleanup());

describe("audit chain", () => {
  it("verifies an intact chain and counts its events", async () => {
    await appendMany(5);
    const result = await verify();
    expect(result).toMatchObject({ ok: true, events: 5 });
  });

  it("links each event to the previous event's hash", async () => {
    await appendMany(3);
    const rows = (
      await t.client.execute("SELECT seq, prev_hash, hash FROM audit_events ORDER BY seq")
    ).rows;
    expect(rows[0].prev_hash).toBe("0".repeat(64));
    expect(rows[1].prev_hash).toBe(rows[0].hash);
    expect(rows[2].prev_hash).toBe(rows[1].hash);
  });

  it("stores old and new values as canonical JSON", async () => {
    await t.db.transaction((tx) =>
      appendAudit(tx, actor, {
        eventType: "audit.exported",
        recordType: "audit_trail",
        recordId: "x",
        new: { filters: { to: "2026-01-31", actor: "system" } },
      }),
    );
    const row = (await t.client.execute("SELECT new_value FROM audit_events")).rows[0];
    expect(row.new_value).toBe('{"filters":{"actor":"system","to":"2026-01-31"}}');
    expect(canonicalJson({ b: 1, a: [{ y: 1, x: 2 }] })).toBe('{"a":[{"x":2,"y":1}],"b":1}');
  });

  it("refuses UPDATE and DELETE through its triggers", async () => {
    await appendMany(2);
    await expect(
      t.client.execute("UPDATE audit_events SET reason = 'changed' WHERE seq = 1"),
    ).rejects.toThrow(/append-only/);
    await expect(t.client.execute("DELETE FROM audit_events WHERE seq = 2")).rejects.toThrow(
      /append-only/,
    );
    expect((await verify()).ok).toBe(true);
  });

  it("detects an altered row", async () => {
    await appendMany(4);
    await t.client.execute("DROP TRIGGER audit_events_no_update");
    await t.client.execute(`UPDATE audit_events SET new_value = '{"n":99}' WHERE seq = 2`);
    expect(await verify()).toMatchObject({ ok: false, brokenAt: 2 });
  });

  it("detects a removed row in the middle", async () => {
    await appendMany(4);
    await t.client.execute("DROP TRIGGER audit_events_no_delete");
    await t.client.execute("DELETE FROM audit_events WHERE seq = 3");
    expect(await verify()).toMatchObject({ ok: false, brokenAt: 3 });
  });

  it("detects rows removed from the end", async () => {
    await appendMany(4);
    await t.client.execute("DROP TRIGGER audit_events_no_delete");
    await t.client.execute("DELETE FROM audit_events WHERE seq = 4");
    expect(await verify()).toMatchObject({ ok: false, brokenAt: 4 });
  });

  it("detects a rewritten row whose own hash was recomputed", async () => {
    await appendMany(3);
    await t.client.execute("DROP TRIGGER audit_events_no_update");
    // A forger who recomputes row 1's hash still breaks row 2's link to it.
    await t.client.execute(
      `UPDATE audit_events SET actor_name = 'Someone Else', hash = '${"f".repeat(64)}' WHERE seq = 1`,
    );
    const result = await verify();
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.brokenAt).toBe(1);
  });

  it("writes nothing when the surrounding transaction rolls back", async () => {
    await appendMany(1);
    await expect(
      t.db.transaction(async (tx) => {
        await appendAudit(tx, actor, {
          eventType: "user.updated",
          recordType: "user",
          recordId: "y",
          old: { name: "a" },
          new: { name: "b" },
        });
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await verify()).toMatchObject({ ok: true, events: 1 });
  });

  it("rejects an event that does not match its schema", async () => {
    await expect(
      t.db.transaction((tx) =>
        // @ts-expect-error — a record type that does not belong to this event type
        appendAudit(tx, actor, {
          eventType: "user.updated",
          recordType: "document",
          recordId: "z",
        }),
      ),
    ).rejects.toThrow();
  });
});

describe("the text SQLite builds for a page of the chain", () => {
  it("is byte for byte what JSON.stringify writes, for any text a user can enter [derived: RFC 8259 §7 and ECMA-262 JSON.stringify]", async () => {
    const char = fc.oneof(
      fc.integer({ min: 0, max: 0x7f }).map((c) => String.fromCharCode(c)),
      fc.constantFrom("é", "µ", "°", "€", "\u2028", "\u2029", "\ufeff", "😀", "𝄞", '"', "\\", "/"),
    );
    const text = fc.option(fc.string({ unit: char, maxLength: 40 }), { nil: null });
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 1, max: 2 ** 40 }),
        text,
        text,
        text,
        async (seq, a, b, c) => {
          // seq is an INTEGER column; a JS number would bind as REAL.
          const row = (
            await t.client.execute({
              sql: "SELECT json_array(?, ?, ?, ?) AS j",
              args: [BigInt(seq), a, b, c],
            })
          ).rows[0];
          expect(row.j).toBe(JSON.stringify([seq, a, b, c]));
        },
      ),
      { numRuns: 300 },
    );
  });

  it("verifies a chain of awkward text across pages and still finds an altered row in a later page", async () => {
    for (const [i, reason] of [
      "tab\there",
      "line\nbreak",
      'quote " and \\ slash',
      "ctrl \u0001\u001f",
      "µ ° € 😀",
      "\u2028 sep",
    ].entries()) {
      await t.db.transaction((tx) =>
        appendAudit(tx, actor, {
          eventType: "user.updated",
          recordType: "user",
          recordId: `w-${i}`,
          old: { name: "before" },
          new: { name: reason },
          reason,
        }),
      );
    }
    expect(await verify()).toMatchObject({ ok: true, events: 6 });
    await t.client.execute("DROP TRIGGER audit_events_no_update");
    await t.client.execute("UPDATE audit_events SET reason = 'edited' WHERE seq = 5");
    expect(await verify()).toMatchObject({ ok: false, brokenAt: 5 });
  });
});
