"use client";

import { useId, type TextareaHTMLAttributes } from "react";
import { FieldFrame, useFieldErrors } from "./field";

export interface TextareaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  name: string;
  label: string;
}

/** A labelled multi-line input whose server-side error appears beside it, like Field. */
export function TextareaField({ name, label, className, rows = 3, ...textarea }: TextareaFieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <FieldFrame id={id} label={label} errors={errors} className={className}>
      <textarea
        id={id}
        name={name}
        rows={rows}
        aria-invalid={errors ? true : undefined}
        aria-describedby={errors ? `${id}-error` : undefined}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm shadow-xs aria-invalid:border-red-700"
        {...textarea}
      />
    </FieldFrame>
  );
}
