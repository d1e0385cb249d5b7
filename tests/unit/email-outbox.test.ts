import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { emailOutbox, users } from "@/db/schema";
import { startFakeSmtpServer } from "@/lib/email/fake-smtp-server";
import { enqueueEmail, nextAttemptDelayMs } from "@/lib/email/outbox";
import { createTestDatabase } from "./support/test-db";

const PORT = 25_000 + Math.floor(Math.random() * 5000);
const MAILBOX = join(process.env.TMPDIR ?? "/tmp", `washproof-mailbox-${PORT}.jsonl`);
process.env.SMTP_URL = `smtp://127.0.0.1:${PORT}`;
process.env.MAILBOX_FILE = MAILBOX;

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let server: Awaited<ReturnType<typeof startFakeSmtpServer>>;

beforeAll(async () => {
  t = await createTestDatabase();
  server = await startFakeSmtpServer({ port: PORT, mailboxFile: MAILBOX });
});
afterAll(async () => {
  await new Promise<void>((r) => server.close(() => r()));
  t.cleanup();
});

describe("e-mail outbox", () => {
  it("queues a message only when the step's transaction commits", async () => {
    await expect(
      t.db.transaction(async (tx) => {
        await enqueueEmail(tx, {
          to: "a@example.test",
          subject: "rolled back",
          text: "never sent",
        });
        await tx.insert(users).values({ email: "dup@x.test", name: "x", passwordHash: "x" });
        await tx.insert(users).values({ email: "dup@x.test", name: "y", passwordHash: "y" }); // fails: unique e-mail
      }),
    ).rejects.toThrow();
    expect(await t.db.select().from(emailOutbox)).toHaveLength(0);

    await t.db.transaction((tx) =>
      enqueueEmail(tx, {
        to: "reviewer@example.test",
        subject: "Review requested",
        text: "Please review PQ-1.",
      }),
    );
    expect(await t.db.select().from(emailOutbox)).toHaveLength(1);
  });

  it("delivers due messages through SMTP and marks them sent", async () => {
    const { deliverDueEmails } = await import("@/lib/email/deliver");
    const result = await deliverDueEmails();
    expect(result).toEqual({ sent: 1, failed: 0 });
    const [row] = await t.db.select().from(emailOutbox);
    expect(row.status).toBe("sent");
    expect(existsSync(MAILBOX)).toBe(true);
    const captured = readFileSync(MAILBOX, "utf8")
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(captured.at(-1)).toMatchObject({
      to: ["reviewer@example.test"],
      subject: "Review requested",
    });
    expect(captured.at(-1).text).toContain("Please review PQ-1.");
  });

  it("sends a message once when two delivery passes that share no memory run at the same moment", async () => {
    // A timer and an action live in different bundles of the server, so each has its own module.
    await t.db.transaction((tx) =>
      enqueueEmail(tx, {
        to: "approver@example.test",
        subject: "Once only",
        text: "Approve PQ-2.",
      }),
    );
    const first = await import("@/lib/email/deliver");
    vi.resetModules();
    const second = await import("@/lib/email/deliver");
    expect(second.deliverDueEmails).not.toBe(first.deliverDueEmails);
    const results = await Promise.all([first.deliverDueEmails(), second.deliverDueEmails()]);
    expect(results.reduce((n, r) => n + r.sent, 0)).toBe(1);
    const captured = readFileSync(MAILBOX, "utf8")
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(captured.filter((m) => m.subject === "Once only")).toHaveLength(1);
    const rows = await t.db.select().from(emailOutbox);
    expect(rows.find((r) => r.subject === "Once only")).toMatchObject({
      status: "sent",
      attempts: 1,
    });
  });

  it("backs off 1, 2, 4, 8 minutes between attempts", () => {
    expect([1, 2, 3, 4].map(nextAttemptDelayMs)).toEqual([60_000, 120_000, 240_000, 480_000]);
  });
});
