"use client";

import { useId, type InputHTMLAttributes, type ReactNode } from "react";
import { useFormResult } from "./action-form";

/** The server's errors for one field of the enclosing ActionForm. */
export function useFieldErrors(name: string): string[] | undefined {
  const { state } = useFormResult();
  return state && !state.ok ? state.fieldErrors?.[name] : undefined;
}

/** The ids a control's aria-describedby names: its hint and its errors. */
export function describedBy(id: string, hint: ReactNode | undefined, errors: string[] | undefined) {
  return [hint ? `${id}-hint` : null, errors ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
}

/** The hint and the server's errors under a control. */
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

/** Label above, the control, then hint and errors: the frame every field shares. */
export function FieldFrame(props: { id: string; label: string; hint?: ReactNode; errors?: string[]; className?: string; children: ReactNode }) {
  return (
    <div className={`space-y-1 ${props.className ?? ""}`}>
      <label htmlFor={props.id} className="block text-sm font-medium text-stone-800">
        {props.label}
      </label>
      {props.children}
      <FieldMessages id={props.id} hint={props.hint} errors={props.errors} />
    </div>
  );
}

export interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  name: string;
  label: string;
  hint?: ReactNode;
}

/** A labelled input whose server-side error appears right beside it. */
export function Field({ name, label, hint, className, ...input }: FieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} errors={errors} className={className}>
      <input
        id={id}
        name={name}
        aria-invalid={errors ? true : undefined}
        aria-describedby={describedBy(id, hint, errors)}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm shadow-xs aria-invalid:border-red-700 focus:border-brand-600"
        {...input}
      />
    </FieldFrame>
  );
}

/** A group error (for checkboxes and the like) shown under its fieldset. */
export function FieldError({ name }: { name: string }) {
  const errors = useFieldErrors(name);
  if (!errors) return null;
  return <p className="text-sm text-red-800">{errors.join(" ")}</p>;
}
