"use server";

import { defineAction, type RevalidateTarget } from "@/lib/actions/define-action";
import {
  addActionSchema,
  advanceNcSchema,
  assignNcSchema,
  cancelNcSchema,
  dispositionSchema,
  itemHoldSchema,
  openChangeFromActionSchema,
  openNcSchema,
  pendingItemsHoldSchema,
  planEffectivenessSchema,
  recordEffectivenessSchema,
  rootCauseSchema,
  signClosureSchema,
  updateActionSchema,
} from "@/lib/schemas/nonconformance";
import { addAction } from "@/lib/server/nonconformances/add-action";
import { advanceNonconformance } from "@/lib/server/nonconformances/advance";
import { assignNonconformance } from "@/lib/server/nonconformances/assign";
import { openChangeFromAction } from "@/lib/server/nonconformances/open-change-from-action";
import { openNonconformance } from "@/lib/server/nonconformances/open-nonconformance";
import { planEffectiveness } from "@/lib/server/nonconformances/plan-effectiveness";
import { recordEffectiveness } from "@/lib/server/nonconformances/record-effectiveness";
import { saveRootCause } from "@/lib/server/nonconformances/save-root-cause";
import { setDisposition } from "@/lib/server/nonconformances/set-disposition";
import { setItemHold } from "@/lib/server/nonconformances/set-item-hold";
import { setPendingItemsHold } from "@/lib/server/nonconformances/set-pending-items-hold";
import { signClosure } from "@/lib/server/nonconformances/sign-closure";
import { updateAction } from "@/lib/server/nonconformances/update-action";
import { verifySigner } from "@/lib/server/signatures/verify-signer";

const refresh = (input: { nonconformanceId: string }): RevalidateTarget[] => [
  `/nonconformances/${input.nonconformanceId}`,
  "/nonconformances",
];
const actorOf = (user: { id: string; name: string }) => ({ id: user.id, name: user.name });

export const openNonconformanceAction = defineAction({
  permission: "nc.open",
  input: openNcSchema,
  run: async ({ user, input }) => {
    const { id } = await openNonconformance(actorOf(user), input);
    return { redirect: `/nonconformances/${id}`, id };
  },
  revalidate: ["/nonconformances"],
});

export const assignNonconformanceAction = defineAction({
  permission: "nc.work",
  input: assignNcSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await assignNonconformance(actorOf(user), input);
    return { message: "Owner saved and told by e-mail." };
  },
  revalidate: refresh,
});

export const setItemHoldAction = defineAction({
  permission: "nc.work",
  input: itemHoldSchema,
  run: async ({ user, input }) => {
    await setItemHold(actorOf(user), input);
    return { message: input.hold === "held" ? "Held." : "Released." };
  },
  revalidate: refresh,
});

export const setPendingItemsHoldAction = defineAction({
  permission: "nc.work",
  input: pendingItemsHoldSchema,
  run: async ({ user, input }) => {
    const { count } = await setPendingItemsHold(actorOf(user), input);
    const what = count === 1 ? "1 item" : `${count} items`;
    return { message: input.hold === "held" ? `${what} held.` : `${what} released.` };
  },
  revalidate: refresh,
});

export const setDispositionAction = defineAction({
  permission: "nc.work",
  input: dispositionSchema,
  run: async ({ user, input }) => {
    await setDisposition(actorOf(user), input);
    return { message: "Disposition recorded." };
  },
  revalidate: refresh,
});

export const saveRootCauseAction = defineAction({
  permission: "nc.work",
  input: rootCauseSchema,
  run: async ({ user, input }) => {
    await saveRootCause(actorOf(user), input);
    return { message: "Root cause saved." };
  },
  revalidate: refresh,
});

export const addNcAction = defineAction({
  permission: "nc.work",
  input: addActionSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await addAction(actorOf(user), input);
    return { message: "Action added; its owner is told by e-mail." };
  },
  revalidate: refresh,
});

export const updateNcAction = defineAction({
  permission: "nc.work",
  input: updateActionSchema,
  run: async ({ user, input }) => {
    await updateAction(actorOf(user), input);
    return { message: "Action updated." };
  },
  revalidate: refresh,
});

export const openChangeFromActionAction = defineAction({
  permission: "change.draft",
  input: openChangeFromActionSchema,
  run: async ({ user, input }) => {
    const cr = await openChangeFromAction(actorOf(user), input);
    return { redirect: `/changes/${cr.id}`, id: cr.id };
  },
  revalidate: (input, result) => [...refresh(input), `/changes/${result.id}`, "/changes"],
});

export const planEffectivenessAction = defineAction({
  permission: "nc.work",
  input: planEffectivenessSchema,
  run: async ({ user, input }) => {
    await planEffectiveness(actorOf(user), input);
    return { message: "Effectiveness check planned." };
  },
  revalidate: refresh,
});

export const recordEffectivenessAction = defineAction({
  permission: "nc.work",
  input: recordEffectivenessSchema,
  run: async ({ user, input }) => {
    await recordEffectiveness(actorOf(user), input);
    return {
      message:
        input.result === "confirmed"
          ? "Effectiveness confirmed. Sign the closure."
          : "Recorded as not effective; the nonconformance is back at its actions.",
    };
  },
  revalidate: refresh,
});

export const advanceNonconformanceAction = defineAction({
  permission: "nc.work",
  input: advanceNcSchema,
  run: async ({ user, input }) => {
    await advanceNonconformance(actorOf(user), input);
    return { message: "Moved on." };
  },
  revalidate: refresh,
});

export const cancelNonconformanceAction = defineAction({
  permission: "nc.work",
  input: cancelNcSchema,
  run: async ({ user, input }) => {
    await advanceNonconformance(actorOf(user), { ...input, to: "cancelled" });
    return { message: "Cancelled." };
  },
  revalidate: refresh,
});

export const signClosureAction = defineAction({
  // The engineer signs the investigation as authored; an approver signs the closure.
  permission: "nc.work",
  when: { field: "meaning", value: "approved", permission: "nc.approve" },
  input: signClosureSchema,
  run: async ({ user, input }) => {
    const signer = await verifySigner({ userId: user.id, password: input.password });
    await signClosure(signer, input);
    return {
      message:
        input.meaning === "approved"
          ? "Approved; the nonconformance is closed."
          : "Signed as authored; an approver signs the closure.",
    };
  },
  revalidate: refresh,
});
