import { z } from "zod";
import "./messages";
import { optionalAuditReason, storedText } from "@/lib/schemas/text";
import { ROLES } from "@/db/enums";

export const PASSWORD_MIN_LENGTH = 12;

const email = storedText().trim().toLowerCase().email("Enter a valid e-mail address.").max(200);

export const signInSchema = z.object({
  email: storedText().trim().min(1, "Enter your e-mail address.").max(200),
  password: z.string().min(1, "Enter your password.").max(200),
});

/** How many earlier passwords (the current one included) a new password must differ from. */
export const PASSWORD_HISTORY = 5;

/**
 * The password rules that need no knowledge of the person, shared by the form and
 * the server. The rest (name, e-mail, guessability, history) are checked by the
 * change-password service with lib/auth/password-rules.ts.
 */
export const passwordChangeSchema = z
  .object({
    currentPassword: z.string().min(1, "Enter your current password."),
    newPassword: z
      .string()
      .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
      .max(200, "Use at most 200 characters.")
      .refine((p) => p.trim() !== "", "Use letters, digits or symbols, not only spaces."),
    confirmPassword: z.string(),
  })
  .refine((v) => v.newPassword === v.confirmPassword, {
    path: ["confirmPassword"],
    message: "The two new passwords differ.",
  })
  .refine((v) => v.newPassword !== v.currentPassword, {
    path: ["newPassword"],
    message: "Choose a password different from the current one.",
  });

export function passwordIsEmail(password: string, userEmail: string) {
  return password.trim().toLowerCase() === userEmail.trim().toLowerCase();
}

export const userSchema = z.object({
  name: storedText().trim().min(2, "Enter the person's full name.").max(120),
  email,
  jobTitle: storedText()
    .trim()
    .max(120)
    .optional()
    .transform((v) => v || null),
  roles: z.array(z.enum(ROLES)).min(1, "Choose at least one role."),
});

export const createUserSchema = userSchema;
// The reason is asked for when the roles change: what a person may sign is a controlled fact.
export const updateUserSchema = userSchema.extend({
  userId: z.string().uuid(),
  reason: optionalAuditReason(),
});
export const userIdSchema = z.object({ userId: z.string().uuid() });
