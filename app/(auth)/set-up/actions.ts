"use server";

import { definePublicAction } from "@/lib/actions/define-action";
import { setUpPlantSchema } from "@/lib/schemas/plant-setup";
import { setUpPlant } from "@/lib/server/plant/set-up-plant";

/**
 * Public because nobody can sign in yet; safe because `setUpPlant` refuses once any user exists,
 * inside the same transaction that would create the first one.
 */
export const setUpPlantAction = definePublicAction({
  input: setUpPlantSchema,
  invalidMessage: "Some values need attention. Nothing was created.",
  run: async ({ input }) => {
    await setUpPlant(input);
    // No session here: the administrator proves the new password at the sign-in page.
    return { redirect: "/sign-in?set-up=done" };
  },
});
