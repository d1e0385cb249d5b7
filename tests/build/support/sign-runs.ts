/**
 * A second writer for the crash test, on the same database file as the server:
 * until it is killed, it opens a test run, records a sample and
 * signs the run "performed" through the services. It prints "signed <run id>"
 * only after the signing has committed, so the test knows which signatures were
 * acknowledged before the kill.
 * Run with `tsx --conditions react-server` so the services' server-only guard loads.
 */
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { gravimetricSampleSchema } from "@/lib/schemas/evidence";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { signRun } from "@/lib/server/evidence/sign-run";

const [partFamilyId, recipeVersionId, lab] = process.argv.slice(2);
const person = async (email: string) =>
  (
    await getDb()
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(eq(users.email, email))
  )[0];
const engineer = await person("engineer@fennmoor.example");
const technician = await person("technician@fennmoor.example");
const sample = gravimetricSampleSchema.parse({
  sampleLabel: "G-1",
  worstCase: "on",
  components: "5",
  filterBeforeMg: "100.2",
  filterAfterMg: "100.9",
});

async function lane(): Promise<never> {
  for (;;) {
    const run = await createRun(engineer, {
      partFamilyId,
      recipeVersionId,
      testType: "gravimetric",
      technicianId: technician.id,
      lab,
      performedOn: "2026-03-02",
    });
    await addSample(technician, { runId: run.id, sample });
    const { hash } = await runContent(getDb(), (await getRunRow(getDb(), run.id))!);
    await signRun({
      userId: technician.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning: "performed",
      contentHash: hash,
    });
    process.stdout.write(`signed ${run.id}\n`);
  }
}

process.stdout.write("ready\n");
await lane();
