"use client";

import { useId, type TextareaHTMLAttributes } from "react";
import { useFormResult } from "./action-form";

export interface TextareaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  name: string;
  label: string;
}

/** A labelled multi-line input whose server-side error appears beside it, like Field. */
export function TextareaField({ name, label, className = "", rows = 3, ...textarea }: TextareaFieldProps) {
  const id = useId();
  const { state } = useFormResult();
  const errors = state && !state.ok ? state.fieldErrors?.[name] : undefined;
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-stone-800">
        {label}
      </label>
      <textarea
        id={id}
        name={name}
        rows={rows}
        aria-invalid={errors ? true : undefined}
        aria-describedby={errors ? `${id}-error` : undefined}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm shadow-xs aria-invalid:border-red-700"
        {...textarea}
      />
      {errors && (
        <p id={`${id}-error`} className="text-sm text-red-800">
          {errors.join(" ")}
        </p>
      )}
    </div>
  );
}
