import { and, asc, eq } from "drizzle-orm";
import { todayUtc } from "@/lib/format/date";
import { labMethodSchema } from "@/lib/schemas/lab-method";
import { approveMethodIn } from "@/lib/server/lab-methods/approve-method-in";
import { draftMethodIn } from "@/lib/server/lab-methods/draft-method";
import { methodContentHash } from "@/lib/server/lab-methods/state";
import { signOffTrainingIn } from "@/lib/server/training/sign-off-training-in";
import { citeMethodsIn } from "@/lib/server/evidence/cite-methods";
import { addMonths } from "@/lib/training/rules";
import type { Tx } from "./client";
import { labMethods, partFamilies, testRuns, users } from "./schema";

/**
 * The demo lab's written methods and who is trained on them, through the same services the
 * screens use. Story: the residue-weighing method was the lab's first written method (February
 * 2025, retrained yearly); the extraction procedure and the membrane analysis were written down
 * in January 2026, the extraction procedure qualified by an earlier valve-body run's declining
 * test. The technician was trained on both that month and had a refresher a month ago; the
 * yearly weighing training lapsed a month ago and waits for a trainer's sign-off.
 */
const GRAVIMETRIC = { drafted: "2025-02-10T09:00:00.000Z", approved: "2025-02-12T14:00:00.000Z" };
const PARTICLE = { drafted: "2026-01-12T09:00:00.000Z", approved: "2026-01-14T11:00:00.000Z" };

const LIQUID = "Filtered neutral aqueous cleaner, 0.5 % in deionised water";

const DAY_MS = 86_400_000;
const daysAgo = (now: Date, days: number) => todayUtc(new Date(now.getTime() - days * DAY_MS));
const at = (day: string, time = "10:00") => new Date(`${day}T${time}:00.000Z`);

export async function seedLabMethods(tx: Tx, now = new Date()) {
  const person = async (email: string) =>
    (
      await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email))
    )[0];
  const engineer = await person("engineer@fennmoor.example");
  const approver = await person("approver@fennmoor.example");
  const technician = await person("technician@fennmoor.example");
  if (!engineer || !approver || !technician) return null;

  // The earliest verified valve-body particle run: its extraction series met the declining test.
  const [qualification] = await tx
    .select({ id: testRuns.id })
    .from(testRuns)
    .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
    .where(
      and(
        eq(partFamilies.code, "PF-VB-210"),
        eq(testRuns.testType, "particle_cleanliness"),
        eq(testRuns.status, "verified"),
      ),
    )
    .orderBy(asc(testRuns.performedOn))
    .limit(1);

  const method = async (raw: unknown, story: { drafted: string; approved: string }) => {
    // Parsed by the form's own schema, so the demo holds only what the screen would accept.
    const input = labMethodSchema.parse(raw);
    const { id } = await draftMethodIn(tx, engineer, input, new Date(story.drafted));
    const [row] = await tx.select().from(labMethods).where(eq(labMethods.id, id));
    await approveMethodIn(
      tx,
      approver,
      { methodId: id, contentHash: methodContentHash(row) },
      new Date(story.approved),
    );
    return id;
  };

  await method(
    {
      kind: "gravimetric",
      code: "GR-01",
      name: "Residue weighing on 5 µm membranes",
      trainingIntervalMonths: 12,
      details: {
        filterMaterial: "PET mesh, pre-weighed",
        poreSizeUm: 5,
        balanceResolutionMg: 0.01,
        dryingTemperatureC: 80,
        dryingTimeMin: 60,
        weighingConditions:
          "Cooled 30 min in the desiccator; weighed at 21 ± 2 °C to constant mass (two weighings within 0.03 mg)",
        practicalLowerLimitMg: 0.5,
        poolingRule:
          "Pool components on one filter until the expected residue is at least 1 mg; record how many",
      },
    },
    GRAVIMETRIC,
  );
  const extraction = await method(
    {
      kind: "extraction",
      code: "EX-01",
      name: "Pressure rinsing of valve bodies and pump housings",
      trainingIntervalMonths: 24,
      qualificationRunId: qualification?.id,
      details: {
        procedure: "pressure_rinsing",
        liquid: LIQUID,
        volumeMl: 1500,
        pressureBar: 3,
        flowLPerMin: 1.2,
        durationS: 90,
        controlledSurface:
          "All wetted internal bores and the outer surface; sealing faces included",
        extractions: 3,
      },
    },
    PARTICLE,
  );
  const analysis = await method(
    {
      kind: "analysis",
      code: "AN-01",
      name: "Membrane analysis, automated light microscope",
      trainingIntervalMonths: 24,
      details: {
        filterMaterial: "PET mesh",
        poreSizeUm: 5,
        system: "light_microscope_automated",
        magnification: 50,
        lowerSizeLimitUm: 5,
        distinguishes: ["reflective", "non_reflective", "fibre"],
      },
    },
    PARTICLE,
  );

  const signOff = (who: { id: string }, code: string, day: string) =>
    signOffTrainingIn(
      tx,
      approver,
      { userId: who.id, methodCode: code, trainedOn: day },
      at(day, "15:00"),
    );
  for (const code of ["EX-01", "AN-01"]) {
    await signOff(engineer, code, "2026-01-15");
    await signOff(technician, code, "2026-01-20");
    await signOff(technician, code, daysAgo(now, 30));
  }
  // Twelve-month interval, signed thirteen months ago: lapsed about a month ago.
  await signOff(technician, "GR-01", addMonths(todayUtc(now), -13));
  return { extraction, analysis };
}

/** The demo's open particle runs cite the lab's methods, as the technician chose them when opening. */
export async function citeOnOpenRuns(tx: Tx, methods: { extraction: string; analysis: string }) {
  const open = await tx
    .select({ id: testRuns.id, technicianId: testRuns.technicianId, createdAt: testRuns.createdAt })
    .from(testRuns)
    .where(and(eq(testRuns.status, "open"), eq(testRuns.testType, "particle_cleanliness")));
  for (const run of open) {
    const [who] = run.technicianId
      ? await tx
          .select({ id: users.id, name: users.name })
          .from(users)
          .where(eq(users.id, run.technicianId))
      : [];
    if (!who) continue;
    await citeMethodsIn(
      tx,
      who,
      {
        runId: run.id,
        extraction: methods.extraction,
        analysis: methods.analysis,
        gravimetric: null,
      },
      new Date(run.createdAt),
    );
  }
}
