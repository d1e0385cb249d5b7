"use client";

import { SelectField, type SelectFieldProps } from "@/components/ui/field";

/**
 * A select in a GET filter form that submits the form as soon as it changes, first emptying the
 * fields whose choices depend on it (`clears`): a list that belongs to the old choice is never
 * offered beside the new one. Without script the form's own button still submits.
 */
export function SubmittingSelect({
  clears = [],
  ...props
}: SelectFieldProps & { clears?: string[] }) {
  return (
    <SelectField
      {...props}
      onChange={(event) => {
        const form = event.currentTarget.form;
        if (!form) return;
        for (const name of clears) {
          const field = form.elements.namedItem(name);
          if (field instanceof HTMLSelectElement || field instanceof HTMLInputElement) {
            field.value = "";
            field.disabled = true; // the old list is not sent, and is seen to be out of date
          }
        }
        form.requestSubmit();
      }}
    />
  );
}
