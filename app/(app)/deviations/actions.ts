"use server";

import { defineAction } from "@/lib/actions/define-action";
import {
  deviationSchema,
  recordLotSchema,
  signDeviationSchema,
  withdrawDeviationSchema,
} from "@/lib/schemas/deviation";
import { createDeviation } from "@/lib/server/deviations/create-deviation";
import { recordDeviationLot } from "@/lib/server/deviations/record-lot";
import { signDeviation } from "@/lib/server/deviations/sign-deviation";
import { withdrawDeviation } from "@/lib/server/deviations/withdraw-deviation";

const refresh = (input: { deviationId: string }) => [
  `/deviations/${input.deviationId}`,
  "/deviations",
  ["/systems", "layout"] as const,
  ["/trace", "layout"] as const,
];

export const createDeviationAction = defineAction({
  permission: "deviation.draft",
  input: deviationSchema,
  from: "payload",
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input }) => {
    const { id } = await createDeviation(user, input);
    return { redirect: `/deviations/${id}`, id };
  },
  revalidate: (_input, result) => ["/deviations", `/deviations/${result.id}`],
});

/** The author's signature sends the draft for approval. */
export const signDeviationAction = defineAction({
  permission: "deviation.draft",
  input: signDeviationSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await signDeviation(user, { ...input, meaning: "authored" });
    return { message: "Signed: the approvers have been asked to approve it." };
  },
  revalidate: refresh,
});

/** The approver's signature makes it active. */
export const approveDeviationAction = defineAction({
  permission: "deviation.approve",
  input: signDeviationSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await signDeviation(user, { ...input, meaning: "approved" });
    return { message: "Signed: the deviation is approved and active." };
  },
  revalidate: refresh,
});

export const withdrawDeviationAction = defineAction({
  permission: "deviation.withdraw",
  input: withdrawDeviationSchema,
  run: async ({ user, input }) => {
    await withdrawDeviation(user, input);
    return { message: "Withdrawn." };
  },
  revalidate: refresh,
});

export const recordDeviationLotAction = defineAction({
  permission: "deviation.record_lot",
  input: recordLotSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    const { lotsUsed } = await recordDeviationLot(user, input);
    return { message: `Lot ${input.lot} counted (${lotsUsed} so far).` };
  },
  revalidate: refresh,
});
