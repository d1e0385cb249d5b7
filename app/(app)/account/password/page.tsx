import type { Metadata } from "next";
import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { PASSWORD_HISTORY, PASSWORD_MIN_LENGTH } from "@/lib/schemas/account";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { changePasswordAction } from "./actions";

export const metadata: Metadata = { title: "Change password" };

export default async function ChangePasswordPage() {
  const user = await requirePageUser("account.change_password", { allowPasswordChange: true });
  return (
    <>
      <PageHeader
        title="Change password"
        description={
          user.mustChangePassword
            ? "You signed in with a temporary password. Choose your own before you continue."
            : "Your password is also your signature's second component: keep it to yourself."
        }
      />
      <ActionForm
        action={changePasswordAction}
        className="max-w-md space-y-4"
        aria-label="Change password"
      >
        <Field
          name="currentPassword"
          label="Current password"
          type="password"
          autoComplete="current-password"
        />
        <Field
          name="newPassword"
          label="New password"
          type="password"
          autoComplete="new-password"
          hint={`At least ${PASSWORD_MIN_LENGTH} characters, hard to guess, not your name or e-mail address, and none of your last ${PASSWORD_HISTORY} passwords.`}
        />
        <Field
          name="confirmPassword"
          label="New password again"
          type="password"
          autoComplete="new-password"
        />
        <SubmitButton>Change password</SubmitButton>
      </ActionForm>
    </>
  );
}
