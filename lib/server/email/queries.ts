import "server-only";
import { desc } from "drizzle-orm";
import { getDb } from "@/db/client";
import { emailOutbox } from "@/db/schema";

export async function listOutbox(limit = 100) {
  return getDb().select().from(emailOutbox).orderBy(desc(emailOutbox.createdAt)).limit(limit);
}
