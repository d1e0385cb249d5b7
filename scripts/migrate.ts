import { openDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { env } from "@/lib/env";

const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
const { db, client } = openDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN);
await migrateDatabase(db, client);
client.close();
console.log(`Migrations applied to ${DATABASE_URL}`);
