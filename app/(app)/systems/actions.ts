"use server";

import { defineAction } from "@/lib/actions/define-action";
import { systemSchema } from "@/lib/schemas/system";
import { updateSystem } from "@/lib/server/systems/update-system";

export const updateSystemAction = defineAction({
  permission: "systems.manage",
  input: systemSchema,
  from: "payload",
  invalidMessage: "Some values need attention. Nothing was saved.",
  run: async ({ user, input }) => {
    await updateSystem(user, input);
    return { message: "Saved." };
  },
  revalidate: [["/systems", "layout"]],
});
