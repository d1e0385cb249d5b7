"use server";

import { z } from "zod";
import { defineAction } from "@/lib/actions/define-action";
import type { FormState } from "@/lib/actions/result";
import { storedText } from "@/lib/schemas/text";
import { createUserSchema, updateUserSchema, userIdSchema } from "@/lib/schemas/account";
import { sendTestEmail } from "@/lib/server/email/send-test-email";
import { createUser } from "@/lib/server/users/create-user";
import { resetPassword } from "@/lib/server/users/reset-password";
import { setUserActive } from "@/lib/server/users/set-user-active";
import { updateUser } from "@/lib/server/users/update-user";

export type TemporaryPasswordState =
  (FormState & { temporaryPassword?: string; email?: string }) | null;

const actorOf = (user: { id: string; name: string }) => ({ id: user.id, name: user.name });

export const createUserAction = defineAction({
  permission: "users.manage",
  input: createUserSchema,
  run: async ({ user, input }) => {
    const { temporaryPassword } = await createUser(actorOf(user), input);
    return { message: `${input.name} can now sign in.`, temporaryPassword, email: input.email };
  },
  revalidate: ["/admin"],
});

export const updateUserAction = defineAction({
  permission: "users.manage",
  input: updateUserSchema,
  run: async ({ user, input }) => {
    await updateUser(actorOf(user), input);
    return { message: "Saved." };
  },
  revalidate: ["/admin"],
});

const activeSchema = userIdSchema.extend({
  active: z.enum(["true", "false"]).transform((v) => v === "true"),
  reason: storedText().trim().min(3, "Give the reason for the audit trail.").max(500),
});

export const setUserActiveAction = defineAction({
  permission: "users.manage",
  input: activeSchema,
  run: async ({ user, input }) => {
    await setUserActive(actorOf(user), input);
    return { message: input.active ? "Reactivated." : "Deactivated; their sessions have ended." };
  },
  revalidate: ["/admin"],
});

export const resetPasswordAction = defineAction({
  permission: "users.manage",
  input: userIdSchema,
  run: async ({ user, input }) => {
    const { temporaryPassword } = await resetPassword(actorOf(user), input);
    return {
      message: "Password reset; the user must choose a new one at sign-in.",
      temporaryPassword,
    };
  },
});

const testEmailSchema = z.object({
  to: storedText().trim().toLowerCase().email("Enter a valid e-mail address."),
});

export const sendTestEmailAction = defineAction({
  permission: "users.manage",
  input: testEmailSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await sendTestEmail(actorOf(user), input);
    return { message: `Queued a test message to ${input.to}.` };
  },
  revalidate: ["/admin/email"],
});
