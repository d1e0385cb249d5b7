/**
 * Serves the built app for browser tests on a fresh, seeded database of its own,
 * so a test run never depends on (or changes) the demo database.
 */
import { spawn } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import { resolve } from "node:path";

const port = process.argv[2] ?? "3100";
const dataDir = resolve("data/e2e");
rmSync(dataDir, { recursive: true, force: true });

process.env.DATABASE_URL = `file:${dataDir}/washproof.db`;
process.env.UPLOAD_DIR = `${dataDir}/uploads`;
process.env.APP_URL = `http://127.0.0.1:${port}`;
process.env.DEMO_MODE = "true";
process.env.MAILBOX_FILE = `${dataDir}/mailbox.jsonl`;
const smtpPort = Number(port) + 1000;
process.env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;

const { openDatabase } = await import("@/db/client");
const { migrateDatabase } = await import("@/db/migrate");
const { seedDemo } = await import("@/db/seed");
const { db, client } = openDatabase(process.env.DATABASE_URL);
await migrateDatabase(db, client);
await seedDemo(db);
client.close();

const { startFakeSmtpServer } = await import("@/lib/email/fake-smtp-server");
await startFakeSmtpServer({ port: smtpPort, mailboxFile: process.env.MAILBOX_FILE });

if (!existsSync(".next/BUILD_ID")) {
  console.error("No production build found: run `npx next build` first (npm test does).");
  process.exit(1);
}
const server = spawn("npx", ["next", "start", "-H", "127.0.0.1", "-p", port], { stdio: "inherit", env: process.env });
for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => server.kill(signal));
server.on("exit", (code) => process.exit(code ?? 0));
