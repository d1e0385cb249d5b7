"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { storedText } from "@/lib/schemas/text";
import { invalid, type FormState } from "@/lib/actions/result";
import { createUserSchema, updateUserSchema, userIdSchema } from "@/lib/schemas/account";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { createUser } from "@/lib/server/users/create-user";
import { resetPassword } from "@/lib/server/users/reset-password";
import { setUserActive } from "@/lib/server/users/set-user-active";
import { updateUser } from "@/lib/server/users/update-user";
import { sendTestEmail } from "@/lib/server/email/send-test-email";
import { deliverSoon } from "@/lib/email/deliver";

export type TemporaryPasswordState = (FormState & { temporaryPassword?: string; email?: string }) | null;

function userFields(formData: FormData) {
  return {
    name: formData.get("name"),
    email: formData.get("email"),
    jobTitle: formData.get("jobTitle") ?? undefined,
    roles: formData.getAll("roles"),
  };
}

export async function createUserAction(_prev: FormState, formData: FormData): Promise<TemporaryPasswordState> {
  const auth = await authorize("users.manage");
  if (!auth.ok) return auth;
  const parsed = createUserSchema.safeParse(userFields(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    const { temporaryPassword } = await createUser({ id: auth.user.id, name: auth.user.name }, parsed.data);
    revalidatePath("/admin");
    return { ok: true, message: `${parsed.data.name} can now sign in.`, temporaryPassword, email: parsed.data.email };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function updateUserAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("users.manage");
  if (!auth.ok) return auth;
  const parsed = updateUserSchema.safeParse({ ...userFields(formData), userId: formData.get("userId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await updateUser({ id: auth.user.id, name: auth.user.name }, parsed.data);
    revalidatePath("/admin");
    return { ok: true, message: "Saved." };
  } catch (error) {
    return toActionFailure(error);
  }
}

const activeSchema = userIdSchema.extend({
  active: z.enum(["true", "false"]).transform((v) => v === "true"),
  reason: storedText().trim().min(3, "Give the reason for the audit trail.").max(500),
});

export async function setUserActiveAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("users.manage");
  if (!auth.ok) return auth;
  const parsed = activeSchema.safeParse({ userId: formData.get("userId"), active: formData.get("active"), reason: formData.get("reason") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await setUserActive({ id: auth.user.id, name: auth.user.name }, parsed.data);
    revalidatePath("/admin");
    return { ok: true, message: parsed.data.active ? "Reactivated." : "Deactivated; their sessions have ended." };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function resetPasswordAction(_prev: FormState, formData: FormData): Promise<TemporaryPasswordState> {
  const auth = await authorize("users.manage");
  if (!auth.ok) return auth;
  const parsed = userIdSchema.safeParse({ userId: formData.get("userId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    const { temporaryPassword } = await resetPassword({ id: auth.user.id, name: auth.user.name }, parsed.data);
    return { ok: true, message: "Password reset; the user must choose a new one at sign-in.", temporaryPassword };
  } catch (error) {
    return toActionFailure(error);
  }
}

const testEmailSchema = z.object({ to: storedText().trim().toLowerCase().email("Enter a valid e-mail address.") });

export async function sendTestEmailAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("users.manage");
  if (!auth.ok) return auth;
  const parsed = testEmailSchema.safeParse({ to: formData.get("to") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await sendTestEmail({ id: auth.user.id, name: auth.user.name }, parsed.data);
    deliverSoon();
    revalidatePath("/admin/email");
    return { ok: true, message: `Queued a test message to ${parsed.data.to}.` };
  } catch (error) {
    return toActionFailure(error);
  }
}
