"use server";

import { defineAction } from "@/lib/actions/define-action";
import { approveMethodSchema, labMethodSchema, methodFormSchema } from "@/lib/schemas/lab-method";
import { approveMethod } from "@/lib/server/lab-methods/approve-method";
import { draftMethod } from "@/lib/server/lab-methods/draft-method";

export const draftMethodAction = defineAction({
  permission: "lab.method_draft",
  input: methodFormSchema,
  alsoReads: [labMethodSchema],
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input, raw, parse }) => {
    const form = raw as Record<string, unknown>;
    const details = { ...(form.details as object), distinguishes: input.distinguishes };
    const method = parse(labMethodSchema, { ...form, details });
    const { id } = await draftMethod({ id: user.id, name: user.name }, method);
    return { redirect: `/lab/methods/${id}`, id };
  },
  revalidate: (_input, result) => ["/lab/methods", `/lab/methods/${result.id}`],
});

/** An approver other than the drafter signs; the version becomes citable and supersedes the last. */
export const approveMethodAction = defineAction({
  permission: "lab.method_approve",
  input: approveMethodSchema,
  run: async ({ user, input }) => {
    await approveMethod(user, input);
    return { message: "Signed: this version is approved and runs may cite it." };
  },
  revalidate: (input) => [
    "/lab/methods",
    `/lab/methods/${input.methodId}`,
    "/lab/training",
    ["/evidence", "layout"] as const,
  ],
});
