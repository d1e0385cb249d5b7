import "server-only";
import { existsSync, readFileSync } from "node:fs";
import { env } from "@/lib/env";
import type { CapturedMessage } from "./fake-smtp-server";

/** Messages captured by the local SMTP server, newest first (demo mode only). */
export function readMailbox(): CapturedMessage[] {
  const file = env().MAILBOX_FILE;
  if (!existsSync(file)) return [];
  return readFileSync(file, "utf8")
    .split("\n")
    .filter(Boolean)
    .map((line) => JSON.parse(line) as CapturedMessage)
    .reverse();
}
