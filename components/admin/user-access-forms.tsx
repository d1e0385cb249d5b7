"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { resetPasswordAction, setUserActiveAction } from "@/app/(app)/admin/actions";
import { TemporaryPassword } from "./temporary-password";

export function UserAccessForms({
  userId,
  active,
  isSelf,
}: {
  userId: string;
  active: boolean;
  isSelf: boolean;
}) {
  return (
    <div className="space-y-8">
      <section aria-labelledby="reset" className="rounded-lg border border-stone-200 bg-white p-4">
        <h2 id="reset" className="font-semibold">
          Reset password
        </h2>
        <p className="mt-1 mb-3 text-sm text-stone-600">
          Ends the user&apos;s sessions, releases a lockout and issues a temporary password.
        </p>
        <ActionForm action={resetPasswordAction} className="space-y-3" aria-label="Reset password">
          <input type="hidden" name="userId" value={userId} />
          <SubmitButton variant="secondary">Reset password</SubmitButton>
          <TemporaryPassword />
        </ActionForm>
      </section>
      {!isSelf && (
        <section
          aria-labelledby="access"
          className="rounded-lg border border-stone-200 bg-white p-4"
        >
          <h2 id="access" className="font-semibold">
            {active ? "Deactivate" : "Reactivate"}
          </h2>
          <p className="mt-1 mb-3 text-sm text-stone-600">
            {active
              ? "The person can no longer sign in; their records and signatures stay."
              : "The person may sign in again."}
          </p>
          {/* Cleared once done: the Reactivate form must not offer the deactivation's reason as its own. */}
          <ActionForm
            resetOnSuccess
            action={setUserActiveAction}
            className="space-y-3"
            aria-label={active ? "Deactivate user" : "Reactivate user"}
          >
            <input type="hidden" name="userId" value={userId} />
            <input type="hidden" name="active" value={active ? "false" : "true"} />
            <Field name="reason" label="Reason" />
            <SubmitButton variant={active ? "danger" : "secondary"}>
              {active ? "Deactivate" : "Reactivate"}
            </SubmitButton>
          </ActionForm>
        </section>
      )}
    </div>
  );
}
