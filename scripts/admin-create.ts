/**
 * Creates the first administrator, the company and the site of an empty installation:
 *   npm run admin:create -- --company "…" --site "…" --name "…" --email "…"
 * The password is read from WASHPROOF_ADMIN_PASSWORD or asked for without echo. Missing
 * flags are asked for too. Refused once any user exists, like the set-up page. The database
 * is data/plant.db (the one `npm run start:empty` serves) unless DATABASE_URL says otherwise.
 */
import { resolve } from "node:path";
import { createInterface } from "node:readline";
import { parseArgs } from "node:util";
import { setProcessDatabase, openDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { env } from "@/lib/env";
import { setUpPlantSchema } from "@/lib/schemas/plant-setup";
import { UserFacingError } from "@/lib/server/errors";
import { setUpPlant } from "@/lib/server/plant/set-up-plant";
import { PLANT_DATABASE_FILE } from "./plant-paths";

const { values } = parseArgs({
  options: {
    company: { type: "string" },
    site: { type: "string" },
    location: { type: "string" },
    name: { type: "string" },
    email: { type: "string" },
  },
});

function ask(question: string, hidden = false): Promise<string> {
  const rl = createInterface({ input: process.stdin, output: process.stdout, terminal: true });
  if (hidden) {
    // Echo nothing of what is typed after the question itself.
    const write = (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput;
    (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput = (s: string) =>
      s.startsWith(question) ? write.call(rl, s) : undefined;
  }
  return new Promise((done) =>
    rl.question(question, (answer) => {
      rl.close();
      if (hidden) process.stdout.write("\n");
      done(answer);
    }),
  );
}

// The same database `npm run start:empty` serves, unless DATABASE_URL names another.
process.env.DATABASE_URL ??= `file:${resolve(PLANT_DATABASE_FILE)}`;
const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
const { db, client } = openDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN);
await migrateDatabase(db, client);
setProcessDatabase(db, client);

const password =
  process.env.WASHPROOF_ADMIN_PASSWORD ?? (await ask("Password (at least 12 characters): ", true));
const input = {
  companyName: values.company ?? (await ask("Company name: ")),
  siteName: values.site ?? (await ask("Site name: ")),
  siteLocation: values.location ?? "",
  adminName: values.name ?? (await ask("Administrator's full name: ")),
  adminEmail: values.email ?? (await ask("Administrator's e-mail: ")),
  password,
  confirmPassword: process.env.WASHPROOF_ADMIN_PASSWORD ?? (await ask("Password again: ", true)),
};
const parsed = setUpPlantSchema.safeParse(input);
if (!parsed.success) {
  for (const issue of parsed.error.issues)
    console.error(`${issue.path.join(".") || "input"}: ${issue.message}`);
  client.close();
  process.exit(1);
}
try {
  await setUpPlant(parsed.data);
  console.log(
    `${parsed.data.adminName} <${parsed.data.adminEmail}> is the administrator of ${parsed.data.companyName}, ${parsed.data.siteName}. Sign in and add the people, cleaning systems and part families.`,
  );
} catch (error) {
  console.error(error instanceof UserFacingError ? error.message : error);
  process.exitCode = 1;
} finally {
  client.close();
}
