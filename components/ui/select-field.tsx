"use client";

import { useId, type ReactNode, type SelectHTMLAttributes } from "react";
import { FieldMessages, useFieldErrors } from "./field";

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  name: string;
  label: string;
  hint?: ReactNode;
  options: { value: string; label: string }[];
  /** Text of an empty first option, e.g. "Choose…". */
  placeholder?: string;
}

/** A labelled select whose server-side error appears beside it, like Field. */
export function SelectField({ name, label, hint, options, placeholder, className = "", ...select }: SelectFieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-stone-800">
        {label}
      </label>
      <select
        id={id}
        name={name}
        aria-invalid={errors ? true : undefined}
        aria-describedby={errors ? `${id}-error` : hint ? `${id}-hint` : undefined}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm aria-invalid:border-red-700"
        {...select}
      >
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldMessages id={id} hint={hint} errors={errors} />
    </div>
  );
}
