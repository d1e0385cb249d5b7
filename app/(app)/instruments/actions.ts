"use server";

import { defineAction } from "@/lib/actions/define-action";
import {
  calibrationSchema,
  instrumentEditSchema,
  instrumentSchema,
  retireInstrumentSchema,
} from "@/lib/schemas/instrument";
import { createInstrument } from "@/lib/server/instruments/create-instrument";
import { recordCalibration } from "@/lib/server/instruments/record-calibration";
import { retireInstrument } from "@/lib/server/instruments/retire-instrument";
import { updateInstrument } from "@/lib/server/instruments/update-instrument";

const KEPT = "Some values need attention. Nothing was saved; everything you typed is still here.";

const refresh = (input: { instrumentId: string }) => [
  "/instruments",
  `/instruments/${input.instrumentId}`,
];

export const createInstrumentAction = defineAction({
  permission: "instrument.manage",
  input: instrumentSchema,
  invalidMessage: KEPT,
  run: async ({ user, input }) => {
    const row = await createInstrument(user, input);
    return { redirect: `/instruments/${row.id}`, id: row.id };
  },
  revalidate: (_input, result) => ["/instruments", `/instruments/${result.id}`],
});

export const updateInstrumentAction = defineAction({
  permission: "instrument.manage",
  input: instrumentEditSchema,
  invalidMessage: KEPT,
  run: async ({ user, input }) => {
    const { changed } = await updateInstrument(user, input);
    return { message: changed.length === 0 ? "Nothing changed." : "Saved." };
  },
  revalidate: refresh,
});

export const retireInstrumentAction = defineAction({
  permission: "instrument.manage",
  input: retireInstrumentSchema,
  run: async ({ user, input }) => {
    await retireInstrument(user, input);
    return { message: "Retired: it can no longer be cited by a run." };
  },
  revalidate: refresh,
});

export const recordCalibrationAction = defineAction({
  permission: "instrument.manage",
  input: calibrationSchema,
  invalidMessage: KEPT,
  run: async ({ user, input }) => {
    const { calibration, nonconformance, suspects } = await recordCalibration(user, input);
    return {
      message: nonconformance
        ? `Recorded as out of tolerance: ${nonconformance.number} was opened, containing ${suspects.length} run${suspects.length === 1 ? "" : "s"} that cited it.`
        : `Calibration recorded; next due ${calibration.dueOn}.`,
    };
  },
  revalidate: (input) => [...refresh(input), "/nonconformances", "/queue"],
});
