"use server";

import { z } from "zod";
import { defineAction } from "@/lib/actions/define-action";
import {
  createControlPlanSchema,
  reviseControlPlanSchema,
  saveControlPlanDraftSchema,
  signControlPlanSchema,
} from "@/lib/schemas/control-plan";
import { auditReason } from "@/lib/schemas/text";
import { createControlPlan } from "@/lib/server/control-plans/create-control-plan";
import { reviseControlPlan } from "@/lib/server/control-plans/revise-control-plan";
import { saveControlPlanDraft } from "@/lib/server/control-plans/save-draft";
import { returnControlPlan, signControlPlan } from "@/lib/server/control-plans/sign-control-plan";

const refresh = (input: { planId?: string }) => [
  "/control-plans",
  ...(input.planId ? [`/control-plans/${input.planId}`] : []),
  "/queue",
];
const planPage = (planId: string) => [`/control-plans/${planId}`, "/control-plans", "/queue"];

export const createControlPlanAction = defineAction({
  permission: "control_plan.draft",
  input: createControlPlanSchema,
  from: "payload",
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input }) => {
    const { planId } = await createControlPlan(user, input);
    return { redirect: `/control-plans/${planId}`, planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});

export const saveControlPlanDraftAction = defineAction({
  permission: "control_plan.draft",
  input: saveControlPlanDraftSchema,
  from: "payload",
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input }) => {
    await saveControlPlanDraft(user, input);
    return { message: "Draft saved." };
  },
  revalidate: () => ["/control-plans", ["/control-plans", "layout"] as const],
});

export const reviseControlPlanAction = defineAction({
  permission: "control_plan.draft",
  input: reviseControlPlanSchema,
  run: async ({ user, input }) => {
    await reviseControlPlan(user, input);
    return { message: "A new draft version is open below." };
  },
  revalidate: refresh,
});

/** The author's signature sends the draft for review. */
export const signControlPlanAction = defineAction({
  permission: "control_plan.draft",
  input: signControlPlanSchema,
  run: async ({ user, input }) => {
    const { planId } = await signControlPlan(user, { ...input, meaning: "authored" });
    return { message: "Signed: the version waits for a reviewer.", planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});

export const reviewControlPlanAction = defineAction({
  permission: "control_plan.review",
  input: signControlPlanSchema,
  run: async ({ user, input }) => {
    const { planId } = await signControlPlan(user, { ...input, meaning: "reviewed" });
    return { message: "Signed: the version waits for an approver.", planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});

/** The approver's signature makes the version effective and supersedes the one before. */
export const approveControlPlanAction = defineAction({
  permission: "control_plan.approve",
  input: signControlPlanSchema,
  run: async ({ user, input }) => {
    const { planId } = await signControlPlan(user, { ...input, meaning: "approved" });
    return { message: "Signed: the version is effective and schedules its tests.", planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});

const returnSchema = z.object({ versionId: z.uuid(), reason: auditReason() });

export const returnControlPlanFromReviewAction = defineAction({
  permission: "control_plan.review",
  input: returnSchema,
  run: async ({ user, input }) => {
    const { planId } = await returnControlPlan(user, input);
    return { message: "Sent back to its author as a draft.", planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});

export const returnControlPlanFromApprovalAction = defineAction({
  permission: "control_plan.approve",
  input: returnSchema,
  run: async ({ user, input }) => {
    const { planId } = await returnControlPlan(user, input);
    return { message: "Sent back to its author as a draft.", planId };
  },
  revalidate: (_input, result) => planPage(result.planId),
});
