/**
 * One command for a fresh machine: migrate, load the demo scenario, build, and
 * serve Washproof at http://localhost:3000 on the embedded SQLite database.
 * With `--empty` (`npm run start:empty`) it loads no demo data and serves a plant's own
 * database, data/plant.db, kept apart from the demo's; its set-up page (or `npm run admin:create`)
 * creates the first administrator.
 */
import "./server-modules-outside-next";
import { spawn, spawnSync } from "node:child_process";
import { resolve } from "node:path";
import { existsSync, mkdirSync, writeFileSync } from "node:fs";
import { PLANT_DATABASE_FILE, PLANT_SIGNING_KEY_FILE, PLANT_UPLOAD_DIR } from "./plant-paths";

const empty = process.argv.includes("--empty");
process.env.DATABASE_URL ??= `file:${resolve(empty ? PLANT_DATABASE_FILE : "data/washproof.db")}`;
process.env.UPLOAD_DIR ??= resolve(empty ? PLANT_UPLOAD_DIR : "data/uploads");
process.env.DEMO_MODE ??= empty ? "false" : "true";
process.env.NEXT_TELEMETRY_DISABLED = "1";
if (empty && !process.env.AUDIT_SIGNING_KEY_FILE && !process.env.AUDIT_SIGNING_KEY) {
  // The production server refuses to run without a checkpoint key. For a first try, make one beside
  // the database and say plainly that it proves nothing there: real records need a key kept elsewhere.
  const keyFile = resolve(PLANT_SIGNING_KEY_FILE);
  if (!existsSync(keyFile)) {
    const { generateSigningKeyPem } = await import("@/lib/audit/checkpoint");
    mkdirSync(resolve("data"), { recursive: true });
    writeFileSync(keyFile, generateSigningKeyPem(), { mode: 0o600 });
  }
  process.env.AUDIT_SIGNING_KEY_FILE = keyFile;
  console.warn(
    `No AUDIT_SIGNING_KEY_FILE is set: using the audit checkpoint key ${keyFile}. It lies beside the database, so it proves nothing against someone who can change both: before keeping real records, set AUDIT_SIGNING_KEY_FILE to a key kept off this machine.`,
  );
}
const port = process.env.PORT ?? "3000";
process.env.APP_URL ??= `http://localhost:${port}`;
process.env.MAILBOX_FILE ??= resolve("data/mailbox.jsonl");
const smtpPort = Number(process.env.DEMO_SMTP_PORT ?? 2525);
process.env.SMTP_URL ??= `smtp://127.0.0.1:${smtpPort}`;

const { openDatabase } = await import("@/db/client");
const { migrateDatabase } = await import("@/db/migrate");
const { seedDemo } = await import("@/db/seed");
const { users } = await import("@/db/schema");
const { db, client } = openDatabase(process.env.DATABASE_URL);
await migrateDatabase(db, client);
if (empty) {
  const someone = await db.select({ id: users.id }).from(users).limit(1);
  console.log(
    someone.length
      ? "Starting without demo data."
      : `Starting without demo data. No one can sign in yet: open http://localhost:${port}/set-up (the sign-in page leads there) or run \`npm run admin:create\` to create the first administrator.`,
  );
} else {
  const { seeded } = await seedDemo(db);
  console.log(seeded ? "Demo data loaded." : "Demo data already present.");
}
client.close();

const { startFakeSmtpServer } = await import("@/lib/email/fake-smtp-server");
await startFakeSmtpServer({ port: smtpPort, mailboxFile: process.env.MAILBOX_FILE });
if (!process.env.AUDIT_SIGNING_KEY_FILE && !process.env.AUDIT_SIGNING_KEY) {
  console.log(
    "Audit checkpoints are signed with a key generated in data/audit-signing-key.pem: no AUDIT_SIGNING_KEY_FILE is configured (fine for a demo, not for real records).",
  );
}
console.log(
  `Demo e-mail is captured on 127.0.0.1:${smtpPort}; admins read it under Admin › E-mail.`,
);

console.log("Building Washproof (about a minute)…");
const build = spawnSync("npx", ["next", "build"], { stdio: "inherit", env: process.env });
if (build.status !== 0) process.exit(build.status ?? 1);

console.log(`\nWashproof is starting at http://localhost:${port}`);
if (!empty) {
  console.log(
    "Demo sign-ins: admin@, engineer@, reviewer@, approver@, technician@, auditor@fennmoor.example",
  );
  console.log("Password for all of them: Washproof-demo-2026\n");
}
const server = spawn("npx", ["next", "start", "-p", port], { stdio: "inherit", env: process.env });
for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => server.kill(signal));
server.on("exit", (code) => process.exit(code ?? 0));
