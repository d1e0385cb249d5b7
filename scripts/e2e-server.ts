/**
 * Serves the built app for browser tests on a fresh, seeded database of its own,
 * so a test run never depends on (or changes) the demo database.
 * `--empty` serves a fresh database with no seed at all (no user, company or site),
 * in data/e2e-empty/, for the test that starts a plant from nothing.
 */
import "./server-modules-outside-next";
import { spawn } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import { resolve } from "node:path";

const empty = process.argv.includes("--empty");
const port = process.argv.slice(2).find((a) => !a.startsWith("--")) ?? "3100";
const dataDir = resolve(empty ? "data/e2e-empty" : "data/e2e");
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
if (!empty) await seedDemo(db);
client.close();

const { startFakeSmtpServer } = await import("@/lib/email/fake-smtp-server");
await startFakeSmtpServer({ port: smtpPort, mailboxFile: process.env.MAILBOX_FILE });

if (!existsSync(".next/BUILD_ID")) {
  console.error("No production build found: run `npx next build` first (npm test does).");
  process.exit(1);
}
const server = spawn("npx", ["next", "start", "-H", "127.0.0.1", "-p", port], {
  stdio: "inherit",
  env: process.env,
});
for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => server.kill(signal));
server.on("exit", (code) => process.exit(code ?? 0));
