"use server";

import { getDb } from "@/db/client";
import { defineAction } from "@/lib/actions/define-action";
import {
  bathRecordSchema,
  createRunSchema,
  detachFileSchema,
  maintenanceIntervalSchema,
  particleRunDataSchema,
  removeSampleSchema,
  reviseRunSchema,
  runIdSchema,
  SAMPLE_SCHEMAS,
  signRunSchema,
} from "@/lib/schemas/evidence";
import { recordBathEntry } from "@/lib/server/bath/record-bath-entry";
import { setMaintenanceInterval } from "@/lib/server/bath/set-maintenance-interval";
import { UserFacingError } from "@/lib/server/errors";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { detachEvidenceFile } from "@/lib/server/evidence/detach-file";
import { removeSample } from "@/lib/server/evidence/remove-sample";
import { reviseRun } from "@/lib/server/evidence/revise-run";
import { getRunRow } from "@/lib/server/evidence/run-content";
import { saveRunData } from "@/lib/server/evidence/save-run-data";
import { signRun } from "@/lib/server/evidence/sign-run";

const actorOf = (user: { id: string; name: string }) => ({ id: user.id, name: user.name });
const runPage = (input: { runId: string }) => [`/evidence/runs/${input.runId}`];

export const createRunAction = defineAction({
  permission: "evidence.record",
  input: createRunSchema,
  run: async ({ user, input }) => {
    const { id } = await createRun(actorOf(user), input);
    return { redirect: `/evidence/runs/${id}` };
  },
  revalidate: ["/evidence"],
});

export const addSampleAction = defineAction({
  permission: "evidence.record",
  input: runIdSchema,
  alsoReads: Object.values(SAMPLE_SCHEMAS),
  run: async ({ user, input, parse }) => {
    const run = await getRunRow(getDb(), input.runId);
    if (!run) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
    // The run's test type picks the sample's schema, so it is parsed once the run is known.
    const sample = parse(SAMPLE_SCHEMAS[run.testType]);
    await addSample(actorOf(user), { runId: run.id, sample });
    return { message: `Sample ${sample.sampleLabel} recorded.` };
  },
  revalidate: runPage,
});

export const removeSampleAction = defineAction({
  permission: "evidence.record",
  input: removeSampleSchema,
  run: async ({ user, input }) => {
    await removeSample(actorOf(user), input);
    return { message: "Sample removed." };
  },
  revalidate: runPage,
});

export const detachFileAction = defineAction({
  permission: "evidence.record",
  input: detachFileSchema,
  run: async ({ user, input }) => {
    const file = await detachEvidenceFile(actorOf(user), input);
    return {
      message: `${file.originalName} detached; the stored file and the reason are kept in the audit trail.`,
    };
  },
  revalidate: runPage,
});

export const saveRunDataAction = defineAction({
  permission: "evidence.record",
  input: runIdSchema,
  alsoReads: [particleRunDataSchema],
  run: async ({ user, input, parse }) => {
    await saveRunData(actorOf(user), { runId: input.runId, data: parse(particleRunDataSchema) });
    return { message: "Extraction series and blank saved." };
  },
  revalidate: runPage,
});

export const signRunAction = defineAction({
  // Signing as performed is the assigned technician's act; verifying is a second person's.
  permission: "evidence.verify",
  when: { field: "meaning", value: "performed", permission: "evidence.sign_performed" },
  input: signRunSchema,
  run: async ({ user, input }) => {
    const { nonconformance } = await signRun({ userId: user.id, ...input });
    return {
      message:
        input.meaning === "performed"
          ? "Signed as performed."
          : nonconformance
            ? `Verified; the run is locked. It failed, so nonconformance ${nonconformance.number} is open for it.`
            : "Verified; the run is locked.",
    };
  },
  revalidate: runPage,
});

export const reviseRunAction = defineAction({
  permission: "evidence.record",
  input: reviseRunSchema,
  run: async ({ user, input }) => {
    const { id } = await reviseRun(actorOf(user), input);
    return { redirect: `/evidence/runs/${id}` };
  },
  revalidate: ["/evidence"],
});

export const recordBathAction = defineAction({
  permission: "bath.record",
  input: bathRecordSchema,
  run: async ({ user, input }) => {
    await recordBathEntry(actorOf(user), input);
    return { message: "Recorded in the bath log." };
  },
  revalidate: (input) => [`/evidence/bath/${input.stageId}`],
});

export const setMaintenanceIntervalAction = defineAction({
  permission: "bath.manage_intervals",
  input: maintenanceIntervalSchema,
  run: async ({ user, input }) => {
    await setMaintenanceInterval(actorOf(user), input);
    return { message: "Interval saved." };
  },
  revalidate: (input) => [`/evidence/bath/${input.stageId}`],
});
