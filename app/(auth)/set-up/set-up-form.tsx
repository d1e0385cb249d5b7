"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { setUpPlantAction } from "./actions";

export function SetUpForm() {
  return (
    <ActionForm
      action={setUpPlantAction}
      className="space-y-5"
      aria-label="Set up this installation"
    >
      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold text-stone-900">Company and site</legend>
        <Field
          name="companyName"
          label="Company name"
          required
          autoFocus
          hint="Printed in the header of every PDF."
        />
        <Field name="siteName" label="Site name" required />
        <Field name="siteLocation" label="Site location" hint="Town or address; optional." />
      </fieldset>
      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold text-stone-900">First administrator</legend>
        <Field name="adminName" label="Full name" autoComplete="name" required />
        <Field name="adminEmail" label="E-mail" type="email" autoComplete="username" required />
        <Field
          name="password"
          label="Password"
          type="password"
          autoComplete="new-password"
          required
          hint="At least 12 characters, hard to guess, not your name or e-mail."
        />
        <Field
          name="confirmPassword"
          label="Repeat the password"
          type="password"
          autoComplete="new-password"
          required
        />
      </fieldset>
      <SubmitButton className="w-full" pendingText="Setting up…">
        Set up and continue to sign in
      </SubmitButton>
    </ActionForm>
  );
}
