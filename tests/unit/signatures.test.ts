import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, users } from "@/db/schema";
import { sha256Hex, canonicalJson } from "@/lib/audit";
import {
  closureProblem,
  dataEntryProblem,
  segregationProblem,
  signatureValidity,
} from "@/lib/signatures/rules";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { createUser } from "@/lib/server/users/create-user";
import { createTestDatabase } from "./support/test-db";

describe("segregation of duties", () => {
  const authored = { userId: "a", meaning: "authored" as const, contentHash: "h" };
  it("refuses the author's approval of the same version", () => {
    expect(segregationProblem([authored], { userId: "a", meaning: "approved" })).toMatch(
      /another person/,
    );
  });
  it("refuses the performer's verification of the same test", () => {
    expect(
      segregationProblem([{ userId: "t", meaning: "performed", contentHash: "h" }], {
        userId: "t",
        meaning: "verified",
      }),
    ).toMatch(/another person/);
  });
  it("refuses the same meaning twice from one person", () => {
    expect(
      segregationProblem([{ userId: "r", meaning: "reviewed", contentHash: "h" }], {
        userId: "r",
        meaning: "reviewed",
      }),
    ).toMatch(/already signed/);
  });
  it("allows another person for every other duty", () => {
    expect(segregationProblem([authored], { userId: "b", meaning: "approved" })).toBeNull();
    expect(segregationProblem([authored], { userId: "b", meaning: "reviewed" })).toBeNull();
    expect(segregationProblem([authored], { userId: "b", meaning: "verified" })).toBeNull();
  });
  // Product brief: on one record, author, reviewer, approver and verifier are different people,
  // whatever roles one person holds.
  it("keeps author, reviewer, approver and verifier apart, naming the rule", () => {
    expect(segregationProblem([authored], { userId: "a", meaning: "reviewed" })).toMatch(
      /^Segregation of duties: you signed this record as "authored"/,
    );
    expect(
      segregationProblem([{ userId: "r", meaning: "reviewed", contentHash: "h" }], {
        userId: "r",
        meaning: "approved",
      }),
    ).toMatch(/as "reviewed"/);
    expect(
      segregationProblem([{ userId: "p", meaning: "approved", contentHash: "h" }], {
        userId: "p",
        meaning: "verified",
      }),
    ).toMatch(/as "approved"/);
  });
  it("counts a duty taken on an earlier hash of the same record", () => {
    // A change request's content hash moves between its steps; the approver is still its approver.
    expect(
      segregationProblem([{ userId: "p", meaning: "approved", contentHash: "h1" }], {
        userId: "p",
        meaning: "verified",
        contentHash: "h2",
      }),
    ).toMatch(/another person/);
    expect(
      segregationProblem([{ userId: "r", meaning: "reviewed", contentHash: "h1" }], {
        userId: "r",
        meaning: "reviewed",
        contentHash: "h2",
      }),
    ).toBeNull();
  });
  it("refuses the verification of whoever entered the run's data", () => {
    expect(dataEntryProblem(["t", "e"], "e")).toMatch(/you entered data of this run/);
    expect(dataEntryProblem(["t"], "e")).toBeNull();
  });
  it("refuses closure by the change's verifier or author", () => {
    const signers = [
      { userId: "e", meaning: "authored" as const },
      { userId: "p", meaning: "approved" as const },
      { userId: "r", meaning: "verified" as const },
    ];
    expect(closureProblem(signers, "r")).toMatch(/as "verified", so another person must close it/);
    expect(closureProblem(signers, "e")).toMatch(/as "authored"/);
    expect(closureProblem(signers, "p")).toBeNull();
  });
});

describe("signature binding", () => {
  it("is valid only while the content hashes to what was signed", () => {
    const v1 = sha256Hex(canonicalJson({ type: "doc", content: [{ text: "Wash at 60 °C" }] }));
    const v1Again = sha256Hex(canonicalJson({ content: [{ text: "Wash at 60 °C" }], type: "doc" }));
    const v2 = sha256Hex(canonicalJson({ type: "doc", content: [{ text: "Wash at 65 °C" }] }));
    expect(signatureValidity(v1, v1Again)).toBe("valid");
    expect(signatureValidity(v1, v2)).toBe("invalid");
    expect(signatureValidity(v1, null)).toBe("invalid");
  });
});

describe("signing services", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  let author: { id: string; password: string };
  let approver: { id: string; password: string };
  beforeAll(async () => {
    t = await createTestDatabase();
    const setup = { id: null, name: "setup" } as const;
    const a = await createUser(setup, {
      name: "Ann Author",
      email: "author@example.test",
      jobTitle: null,
      roles: ["engineer", "approver"],
    });
    const b = await createUser(setup, {
      name: "Bo Approver",
      email: "approver@example.test",
      jobTitle: null,
      roles: ["approver"],
    });
    author = { id: a.id, password: a.temporaryPassword };
    approver = { id: b.id, password: b.temporaryPassword };
  });
  afterAll(() => t.cleanup());

  it("a wrong password is refused, audited and counted toward the lockout", async () => {
    await expect(
      verifySigner({ userId: approver.id, password: "wrong password" }),
    ).rejects.toMatchObject({ field: "password" });
    const [row] = await t.db.select().from(users).where(eq(users.id, approver.id));
    expect(row.failedAttempts).toBe(1);
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, approver.id));
    expect(events.map((e) => JSON.parse(e.newValue ?? "{}").during)).toContain("signing");
  });

  it("binds the signature to the hash, with printed name and time, and enforces segregation", async () => {
    const hash = sha256Hex("version 1 content");
    const signer = await verifySigner({ userId: author.id, password: author.password });
    await t.db.transaction((tx) =>
      applySignature(tx, {
        signer,
        recordType: "document_version",
        recordId: "dv-1",
        meaning: "authored",
        contentHash: hash,
      }),
    );
    await expect(
      t.db.transaction((tx) =>
        applySignature(tx, {
          signer,
          recordType: "document_version",
          recordId: "dv-1",
          meaning: "approved",
          contentHash: hash,
        }),
      ),
    ).rejects.toThrow(/another person/);
    const other = await verifySigner({ userId: approver.id, password: approver.password });
    const sig = await t.db.transaction((tx) =>
      applySignature(
        tx,
        {
          signer: other,
          recordType: "document_version",
          recordId: "dv-1",
          meaning: "approved",
          contentHash: hash,
        },
        new Date("2026-04-01T09:30:00.000Z"),
      ),
    );
    expect(sig).toMatchObject({
      printedName: "Bo Approver",
      meaning: "approved",
      contentHash: hash,
      signedAt: "2026-04-01T09:30:00.000Z",
    });
    const audit = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, sig.id));
    expect(audit[0].action).toBe("signature.applied");
  });
});
