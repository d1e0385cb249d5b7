import { eq } from "drizzle-orm";
import { asOf } from "@/lib/audit/seed-stamp";
import { addDays } from "@/lib/instruments/calibration";
import { todayUtc } from "@/lib/format/date";
import { calibrationSchema, instrumentSchema } from "@/lib/schemas/instrument";
import { createInstrumentIn } from "@/lib/server/instruments/create-instrument";
import { recordCalibrationIn } from "@/lib/server/instruments/record-calibration";
import type { Tx } from "./client";
import { instruments, testRunInstruments, users } from "./schema";

/** An invented external calibration lab. */
const CAL_LAB = "Harrowgate Metrology";

/**
 * The lab's register, through the services the screens use: the filter balance, the membrane
 * analysis system, the rinse conductivity meter (its calibration falls due within the fortnight)
 * and a test-ink set. Their earlier calibrations cover the demo's runs that cite them.
 */
export async function seedInstruments(tx: Tx, now = new Date()) {
  const person = async (email: string) =>
    (
      await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email))
    )[0];
  const engineer = await person("engineer@fennmoor.example");
  const technician = await person("technician@fennmoor.example");
  if (!engineer || !technician) return;
  const today = todayUtc(now);
  const at = (day: string, hour: number) =>
    new Date(`${day}T${String(hour).padStart(2, "0")}:00:00.000Z`);

  const register = (day: string, fields: Record<string, string>) =>
    asOf(at(day, 9), engineer, () =>
      createInstrumentIn(tx, engineer, instrumentSchema.parse(fields), at(day, 9)),
    );
  const calibrate = (id: string, day: string, fields: Record<string, string>) =>
    asOf(at(day, 14), technician, () =>
      recordCalibrationIn(
        tx,
        technician,
        calibrationSchema.parse({ instrumentId: id, calibratedOn: day, ...fields }),
        at(day, 14),
      ),
    );
  const external = { performer: "external", performedBy: CAL_LAB, result: "pass" };

  const balance = await register("2025-05-20", {
    assetNumber: "BAL-01",
    kind: "balance",
    description: "Analytical balance for filter weighing",
    location: "Cleanliness lab, weighing room",
    range: "0–220 g",
    resolution: "0.01 mg",
    calibrationIntervalMonths: "12",
  });
  await calibrate(balance.id, "2025-06-12", { ...external, certificateNumber: "HM-25-1187" });
  await calibrate(balance.id, "2026-06-10", { ...external, certificateNumber: "HM-26-0944" });

  const analyser = await register("2025-05-20", {
    assetNumber: "AN-01",
    kind: "automated_analysis",
    description: "Automated light-microscope membrane analysis",
    location: "Cleanliness lab, analysis bench",
    range: "5–3000 µm",
    resolution: "2.5 µm per pixel at 50×",
    calibrationIntervalMonths: "12",
  });
  await calibrate(analyser.id, "2025-09-02", { ...external, certificateNumber: "HM-25-1530" });
  await calibrate(analyser.id, "2026-09-01", {
    ...external,
    certificateNumber: "HM-26-1402",
    result: "adjusted",
    note: "Scale re-set against the stage micrometer; within tolerance as found.",
  });

  const meter = await register("2025-05-20", {
    assetNumber: "CM-01",
    kind: "conductivity_meter",
    description: "Conductivity meter for the final rinse",
    location: "Washer AW3, final rinse tank",
    range: "0.1–2000 µS/cm",
    resolution: "0.1 µS/cm",
    calibrationIntervalMonths: "6",
  });
  const inHouse = { performer: "in_house", performedBy: technician.name, result: "pass" };
  await calibrate(meter.id, "2025-06-20", inHouse);
  await calibrate(meter.id, "2025-12-15", inHouse);
  // The latest, dated in the demo's story, falls due within the fortnight: it shows in My queue.
  const last = addDays(today, -170);
  await calibrate(meter.id, last, { ...inHouse, dueOn: addDays(today, 12) });

  await register(addDays(today, -60), {
    assetNumber: "INK-01",
    kind: "test_ink_set",
    description: "Test inks 30–56 mN/m",
    location: "Cleanliness lab, ink cabinet",
    range: "30–56 mN/m",
    resolution: "2 mN/m steps",
    expiresOn: addDays(today, 120),
  });
}

/**
 * Cites register entries on a demo run as it is written (its signatures bind to the list);
 * answers the asset numbers for the run's content hash.
 */
export async function citeDemoInstruments(tx: Tx, runId: string, assetNumbers: readonly string[]) {
  const cited: string[] = [];
  for (const assetNumber of assetNumbers) {
    const [row] = await tx
      .select()
      .from(instruments)
      .where(eq(instruments.assetNumber, assetNumber));
    if (!row) continue;
    await tx.insert(testRunInstruments).values({ runId, instrumentId: row.id });
    cited.push(assetNumber);
  }
  return cited;
}
