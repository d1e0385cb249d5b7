"use client";

import { useId, type InputHTMLAttributes, type ReactNode } from "react";
import { useFormResult } from "./action-form";

export interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  name: string;
  label: string;
  hint?: ReactNode;
}

/** The server's errors for one field of the enclosing ActionForm. */
export function useFieldErrors(name: string): string[] | undefined {
  const { state } = useFormResult();
  return state && !state.ok ? state.fieldErrors?.[name] : undefined;
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
    </div>
  );
}

/** A group error (for checkboxes and the like) shown under its fieldset. */
export function FieldError({ name }: { name: string }) {
  const errors = useFieldErrors(name);
  if (!errors) return null;
  return <p className="text-sm text-red-800">{errors.join(" ")}</p>;
}

/** Label above, control, then the server's error: the frame SelectField and TextareaField share. */
export function FieldFrame({ id, label, errors, className = "", children }: { id: string; label: string; errors?: string[]; className?: string; children: ReactNode }) {
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-stone-800">
        {label}
      </label>
      {children}
      {errors && (
        <p id={`${id}-error`} className="text-sm text-red-800">
          {errors.join(" ")}
        </p>
      )}
    </div>
  );
}
