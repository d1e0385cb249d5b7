import { appendFileSync, mkdirSync } from "node:fs";
import { dirname } from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface CapturedMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

/**
 * A capturing SMTP server on 127.0.0.1 for the demo and the tests: it accepts
 * every message and appends it, parsed, to a JSON-lines file the Mailbox reads.
 * Never for production, where SMTP_URL names a real server.
 */
export function startFakeSmtpServer(opts: { port: number; mailboxFile: string }) {
  mkdirSync(dirname(opts.mailboxFile), { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const message: CapturedMessage = {
            id: crypto.randomUUID(),
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? "",
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: typeof mail.html === "string" ? mail.html : null,
          };
          appendFileSync(opts.mailboxFile, `${JSON.stringify(message)}\n`);
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  return new Promise<SMTPServer>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, "127.0.0.1", () => resolve(server));
  });
}
