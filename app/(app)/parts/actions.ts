"use server";

import { defineAction } from "@/lib/actions/define-action";
import { qualifyCombinationSchema } from "@/lib/schemas/combination";
import { partFamilySchema, updatePartFamilySchema } from "@/lib/schemas/part-family";
import { openSpecChangeSchema, reviseSpecSchema, specSchema } from "@/lib/schemas/spec";
import { createPartFamily } from "@/lib/server/plant/create-part-family";
import { createSpec } from "@/lib/server/plant/create-spec";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import { openSpecificationChange } from "@/lib/server/plant/open-spec-change";
import { reviseSpec } from "@/lib/server/plant/revise-spec";
import { updatePartFamily } from "@/lib/server/plant/update-part-family";

const NOT_SAVED = "Some values need attention. Nothing was saved.";

export const createPartFamilyAction = defineAction({
  permission: "parts.manage",
  input: partFamilySchema,
  invalidMessage: NOT_SAVED,
  run: async ({ user, input }) => {
    await createPartFamily(user, input);
    return { redirect: "/parts" };
  },
  revalidate: [["/parts", "layout"]],
});

export const updatePartFamilyAction = defineAction({
  permission: "parts.manage",
  input: updatePartFamilySchema,
  invalidMessage: NOT_SAVED,
  run: async ({ user, input }) => {
    await updatePartFamily(user, input);
    return { message: "Saved." };
  },
  revalidate: [["/parts", "layout"]],
});

export const createSpecAction = defineAction({
  permission: "parts.manage",
  input: specSchema,
  invalidMessage: NOT_SAVED,
  run: async ({ user, input }) => {
    const spec = await createSpec(user, input);
    return { redirect: `/parts/specs/${spec.id}` };
  },
  revalidate: [["/parts", "layout"]],
});

/** The answer carries what the revision changed and, when it tightens, what it affects, for the form to show. */
export const reviseSpecAction = defineAction({
  permission: "parts.manage",
  input: reviseSpecSchema,
  invalidMessage: NOT_SAVED,
  run: async ({ user, input }) => {
    const revision = await reviseSpec(user, input);
    return {
      message: `Revision ${input.revision} is in force; the previous revision is superseded.`,
      newSpecId: revision.specId,
      changes: revision.comparison.changes,
      tightens: revision.comparison.tightens,
      affected: revision.affected,
    };
  },
  revalidate: [["/parts", "layout"]],
});

export const qualifyCombinationAction = defineAction({
  permission: "parts.manage",
  input: qualifyCombinationSchema,
  invalidMessage: NOT_SAVED,
  run: async ({ user, input }) => {
    await qualifyCombination(user, input);
    return { message: "Combination qualified." };
  },
  revalidate: [["/parts", "layout"]],
});

/** A revised specification opens its change request on a qualified recipe, prefilled with the limits old → new. */
export const openSpecChangeAction = defineAction({
  permission: "change.draft",
  input: openSpecChangeSchema,
  run: async ({ user, input }) => {
    const cr = await openSpecificationChange(user, input);
    return { redirect: `/changes/${cr.id}`, id: cr.id };
  },
  revalidate: (input) => [`/parts/specs/${input.specId}`, "/changes"],
});
