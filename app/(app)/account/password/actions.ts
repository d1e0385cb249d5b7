"use server";

import { redirect } from "next/navigation";
import { invalid, type FormState } from "@/lib/actions/result";
import { passwordChangeSchema } from "@/lib/schemas/account";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";
import { changePassword } from "@/lib/server/users/change-password";

export async function changePasswordAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("account.change_password");
  if (!auth.ok) return auth;
  const parsed = passwordChangeSchema.safeParse({
    currentPassword: formData.get("currentPassword"),
    newPassword: formData.get("newPassword"),
    confirmPassword: formData.get("confirmPassword"),
  });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await changePassword({ userId: auth.user.id, sessionId: auth.user.sessionId, ...parsed.data });
  } catch (error) {
    return toActionFailure(error);
  }
  redirect("/?password=changed");
}
