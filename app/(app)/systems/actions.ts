"use server";

import { defineAction } from "@/lib/actions/define-action";
import { newSystemFormSchema, retireSystemSchema, systemSchema } from "@/lib/schemas/system";
import { createSystem } from "@/lib/server/systems/create-system";
import { retireSystem } from "@/lib/server/systems/retire-system";
import { updateSystem } from "@/lib/server/systems/update-system";

export const createSystemAction = defineAction({
  permission: "systems.manage",
  input: newSystemFormSchema,
  from: "payload",
  invalidMessage: "Some values need attention. Nothing was saved.",
  run: async ({ user, input }) => {
    const system = await createSystem(user, input);
    return { redirect: `/systems/${system.id}` };
  },
  revalidate: [["/systems", "layout"]],
});

export const updateSystemAction = defineAction({
  permission: "systems.manage",
  input: systemSchema,
  from: "payload",
  invalidMessage: "Some values need attention. Nothing was saved.",
  run: async ({ user, input }) => {
    const { changeRequestId } = await updateSystem(user, input);
    // The washer runs effective recipes: the edit became an equipment change request, shown next.
    if (changeRequestId) return { redirect: `/changes/${changeRequestId}` };
    return { message: "Saved." };
  },
  revalidate: [["/systems", "layout"], "/changes"],
});

export const retireSystemAction = defineAction({
  permission: "systems.manage",
  input: retireSystemSchema,
  run: async ({ user, input }) => {
    await retireSystem(user, input);
    return { message: "Retired. Its records stay and can still be traced." };
  },
  revalidate: [["/systems", "layout"]],
});
