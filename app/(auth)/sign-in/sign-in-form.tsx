"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { signInAction } from "./actions";

export function SignInForm() {
  return (
    <ActionForm action={signInAction} className="space-y-4" aria-label="Sign in">
      <Field name="email" label="E-mail" type="email" autoComplete="username" required autoFocus />
      <Field
        name="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        required
      />
      <SubmitButton className="w-full" pendingText="Signing in…">
        Sign in
      </SubmitButton>
    </ActionForm>
  );
}
