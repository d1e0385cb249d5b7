"use client";

import { ActionForm } from "@/components/ui/action-form";
import { ChoiceGroup, Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { ROLES, type Role } from "@/db/enums";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { FormState } from "@/lib/actions/result";
import { TemporaryPassword } from "./temporary-password";

export interface UserFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  user?: { id: string; name: string; email: string; jobTitle: string | null; roles: Role[] };
  submitLabel: string;
}

const ROLE_HINTS: Record<Role, string> = {
  admin: "users, roles, systems, requalification matrix",
  engineer: "drafts protocols, recipes, change requests",
  reviewer: "comments, signs reviewed or sends back",
  approver: "signs approved or rejects",
  technician: "records results, signs performed",
  auditor: "reads and traces everything, changes nothing",
};

export function UserForm({ action, user, submitLabel }: UserFormProps) {
  return (
    // A new user's form clears once created, so a second click cannot submit the same person again.
    <ActionForm
      action={action}
      className="max-w-xl space-y-4"
      aria-label={user ? "Edit user" : "New user"}
      resetOnSuccess={!user}
    >
      {user && <input type="hidden" name="userId" value={user.id} />}
      <Field name="name" label="Full name" defaultValue={user?.name} autoComplete="off" />
      <Field
        name="email"
        label="E-mail"
        type="email"
        defaultValue={user?.email}
        autoComplete="off"
      />
      <Field name="jobTitle" label="Job title (optional)" defaultValue={user?.jobTitle ?? ""} />
      <ChoiceGroup
        type="checkbox"
        name="roles"
        legend="Roles"
        hint="Nobody may sign both “authored” and “approved” on the same version, whatever their roles."
        defaultValues={user?.roles ?? []}
        options={ROLES.map((role) => ({
          value: role,
          label: (
            <>
              <span className="font-medium">{ROLE_LABELS[role]}</span>{" "}
              <span className="text-stone-600">— {ROLE_HINTS[role]}</span>
            </>
          ),
        }))}
      />
      {user && (
        <Field
          name="reason"
          label="Reason for a role change"
          hint="Needed when the roles change; kept in the audit trail."
        />
      )}
      <SubmitButton>{submitLabel}</SubmitButton>
      <TemporaryPassword />
    </ActionForm>
  );
}
