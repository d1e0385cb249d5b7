import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appendAudit, verifyAuditChain } from "@/lib/audit";
import { reasonSchema } from "@/lib/schemas/document";
import { storedText, TEXT_CONTROL_MESSAGE, TEXT_SURROGATE_MESSAGE } from "@/lib/schemas/text";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const actor = { id: "u-1", name: "Test Engineer" };
const documentId = "00000000-0000-4000-8000-000000000001";

beforeAll(async () => {
  t = await createTestDatabase();
});
afterAll(() => t.cleanup());

// Text a person or a script can send: everyday letters mixed with the characters that
// do not survive storage (NUL, lone surrogates), other controls, and bidi overrides.
const awkward = fc.string({
  unit: fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom("a", "Z", "7", " ", "µ", "°", "é", "😀") },
    {
      weight: 2,
      arbitrary: fc.constantFrom(
        "\u0000",
        "\ud800",
        "\udfff",
        "\u202e",
        "\u202d",
        "\u2066",
        "\u200f",
        "\u0001",
        "\u001b",
        "\u007f",
        "\u0085",
        "\t",
        "\n",
        "\r\n",
        "\r",
      ),
    },
    { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 3 }) },
  ),
  minLength: 5,
  maxLength: 60,
});

async function storedReasonOf(seq: number) {
  const row = (
    await t.client.execute({ sql: "SELECT reason FROM audit_events WHERE seq = ?", args: [seq] })
  ).rows[0];
  return row.reason as string | null;
}

describe("stored text round-trips", () => {
  it("a reason is either refused beside its field or stored, read back and hashed exactly as accepted", async () => {
    await fc.assert(
      fc.asyncProperty(awkward, async (typed) => {
        const parsed = reasonSchema.safeParse({ documentId, reason: typed });
        if (!parsed.success) {
          // Refused: a message a person can act on, beside the field it concerns.
          for (const issue of parsed.error.issues) expect(issue.path).toEqual(["reason"]);
          return;
        }
        const { seq } = await t.db.transaction((tx) =>
          appendAudit(tx, actor, {
            eventType: "email.test_sent",
            recordType: "email",
            recordId: documentId,
            new: { to: parsed.data.reason },
            reason: parsed.data.reason,
          }),
        );
        expect(await storedReasonOf(seq)).toBe(parsed.data.reason);
        expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true });
      }),
      { numRuns: 300 },
    );
  });

  it("the audit chain refuses text the database would give back changed, so it never hashes what it does not store", async () => {
    await fc.assert(
      fc.asyncProperty(awkward, async (reason) => {
        let seq: number;
        try {
          ({ seq } = await t.db.transaction((tx) =>
            appendAudit(tx, actor, {
              eventType: "auth.signed_in",
              recordType: "user",
              recordId: documentId,
              reason,
            }),
          ));
        } catch (error) {
          expect(String(error)).toMatch(/NUL or a lone surrogate/);
          return;
        }
        expect(await storedReasonOf(seq)).toBe(reason);
      }),
      { numRuns: 300 },
    );
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true });
  });

  it("names the problem in plain words and keeps tabs, line breaks and right-to-left marks", () => {
    const schema = storedText().trim().max(200);
    expect(schema.safeParse("cut at\u0000here").error?.issues[0].message).toBe(
      TEXT_CONTROL_MESSAGE,
    );
    expect(schema.safeParse("escape \u001b[31m").error?.issues[0].message).toBe(
      TEXT_CONTROL_MESSAGE,
    );
    expect(schema.safeParse("half \ud83d emoji").error?.issues[0].message).toBe(
      TEXT_SURROGATE_MESSAGE,
    );
    expect(schema.parse("a\tb\r\nc\rd")).toBe("a\tb\nc\nd");
    expect(schema.parse("abc \u202e fed")).toBe("abc \u202e fed");
  });
});

describe("verification reports every break", () => {
  it("names two independent alterations, not only the first", async () => {
    const local = await createTestDatabase();
    try {
      for (let i = 0; i < 6; i++) {
        await local.db.transaction((tx) =>
          appendAudit(tx, actor, {
            eventType: "audit.exported",
            recordType: "audit_trail",
            recordId: `r-${i}`,
            new: { filters: { n: i } },
          }),
        );
      }
      await local.client.execute("DROP TRIGGER audit_events_no_update");
      await local.client.execute(`UPDATE audit_events SET new_value = '{"n":99}' WHERE seq = 2`);
      await local.client.execute(
        `UPDATE audit_events SET actor_name = 'Someone Else' WHERE seq = 5`,
      );
      for (const page of [undefined, 1, 4]) {
        const result = await verifyAuditChain(local.db, { page });
        expect(result.ok).toBe(false);
        expect(result.breaks).toEqual([
          { seq: 2, reason: "event 2 was altered after it was written" },
          { seq: 5, reason: "event 5 was altered after it was written" },
        ]);
      }
    } finally {
      local.cleanup();
    }
  });

  it("names a gap in the middle and rows cut from the end together", async () => {
    const local = await createTestDatabase();
    try {
      for (let i = 0; i < 6; i++) {
        await local.db.transaction((tx) =>
          appendAudit(tx, actor, {
            eventType: "audit.exported",
            recordType: "audit_trail",
            recordId: `r-${i}`,
            new: { filters: { n: i } },
          }),
        );
      }
      await local.client.execute("DROP TRIGGER audit_events_no_delete");
      await local.client.execute("DELETE FROM audit_events WHERE seq IN (2, 3, 6)");
      const result = await verifyAuditChain(local.db, { page: 2 });
      expect(result.breaks).toEqual([
        { seq: 2, reason: "events 2–3 are missing" },
        { seq: 6, reason: "event 6 was removed from the end" },
      ]);
    } finally {
      local.cleanup();
    }
  });
});
