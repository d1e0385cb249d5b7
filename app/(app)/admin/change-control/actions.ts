"use server";

import { defineAction } from "@/lib/actions/define-action";
import { changeControlSettingsSchema } from "@/lib/schemas/change-types";
import { setChangeControlSettings } from "@/lib/server/changes/settings";

/** The plant's emergency approval period and effectiveness-check size (admin's change-control settings). */
export const saveChangeControlSettingsAction = defineAction({
  permission: "matrix.manage",
  input: changeControlSettingsSchema,
  run: async ({ user, input }) => {
    await setChangeControlSettings(user, input);
    return { message: "Saved. New emergency changes and closures use these settings." };
  },
  revalidate: ["/admin/change-control"],
});
