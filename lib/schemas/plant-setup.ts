import { z } from "zod";
import "./messages";
import { PASSWORD_MIN_LENGTH, passwordIsEmail } from "./account";
import { storedText } from "./text";

/** The one-time set-up of an empty installation: its company, its first site and its first administrator. */
export const setUpPlantSchema = z
  .object({
    companyName: storedText()
      .trim()
      .min(2, "Enter the company's name.")
      .max(120, "Use at most 120 characters."),
    siteName: storedText()
      .trim()
      .min(2, "Enter the site's name.")
      .max(120, "Use at most 120 characters."),
    siteLocation: storedText()
      .trim()
      .max(120)
      .optional()
      .transform((v) => v || null),
    adminName: storedText().trim().min(2, "Enter the administrator's full name.").max(120),
    adminEmail: z.string().trim().toLowerCase().email("Enter a valid e-mail address.").max(200),
    password: z
      .string()
      .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
      .max(200, "Use at most 200 characters."),
    confirmPassword: z.string(),
  })
  .refine((v) => v.password === v.confirmPassword, {
    path: ["confirmPassword"],
    message: "The two passwords differ.",
  })
  .refine((v) => !passwordIsEmail(v.password, v.adminEmail), {
    path: ["password"],
    message: "Choose a password other than the e-mail address.",
  });
export type SetUpPlantInput = z.output<typeof setUpPlantSchema>;
