/** Runs the capturing SMTP server by itself: `npx tsx scripts/fake-smtp.ts [port] [mailbox file]`. */
import { resolve } from "node:path";
import { startFakeSmtpServer } from "@/lib/email/fake-smtp-server";

const port = Number(process.argv[2] ?? 2525);
const mailboxFile = resolve(process.argv[3] ?? "data/mailbox.jsonl");
await startFakeSmtpServer({ port, mailboxFile });
console.log(`Capturing SMTP server on 127.0.0.1:${port}, writing to ${mailboxFile}`);
