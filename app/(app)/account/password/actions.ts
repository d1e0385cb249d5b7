"use server";

import { defineAction } from "@/lib/actions/define-action";
import { passwordChangeSchema } from "@/lib/schemas/account";
import { changePassword } from "@/lib/server/users/change-password";

export const changePasswordAction = defineAction({
  permission: "account.change_password",
  input: passwordChangeSchema,
  run: async ({ user, input }) => {
    await changePassword({ userId: user.id, sessionId: user.sessionId, ...input });
    return { redirect: "/?password=changed" };
  },
});
