"use client";

import { useId, type InputHTMLAttributes, type ReactNode } from "react";
import { useFormResult } from "./action-form";

export interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  name: string;
  label: string;
  hint?: ReactNode;
}

/** A labelled input whose server-side error appears right beside it. */
export function Field({ name, label, hint, className = "", ...input }: FieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  const describedBy = [hint ? `${id}-hint` : null, errors ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-stone-800">
        {label}
      </label>
      <input
        id={id}
        name={name}
        aria-invalid={errors ? true : undefined}
        aria-describedby={describedBy}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm shadow-xs aria-invalid:border-red-700 focus:border-brand-600"
        {...input}
      />
      <FieldMessages id={id} hint={hint} errors={errors} />
    </div>
  );
}

/** The hint and the server's errors under a control, with the ids its aria-describedby names. */
export function FieldMessages({ id, hint, errors }: { id: string; hint?: ReactNode; errors?: string[] }) {
  return (
    <>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-stone-600">
          {hint}
        </p>
      )}
      {errors && (
        <p id={`${id}-error`} className="text-sm text-red-800">
          {errors.join(" ")}
        </p>
      )}
    </>
  );
}

/** The field's errors from the form's last result. */
export function useFieldErrors(name: string) {
  const { state } = useFormResult();
  return state && !state.ok ? state.fieldErrors?.[name] : undefined;
}

/** A group error (for checkboxes and the like) shown under its fieldset. */
export function FieldError({ name }: { name: string }) {
  const errors = useFieldErrors(name);
  if (!errors) return null;
  return <p className="text-sm text-red-800">{errors.join(" ")}</p>;
}
