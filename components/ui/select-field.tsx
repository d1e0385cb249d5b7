"use client";

import { useId, type SelectHTMLAttributes } from "react";
import { FieldFrame, useFieldErrors } from "./field";

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  name: string;
  label: string;
  options: { value: string; label: string }[];
  /** A first, empty choice such as "— none —". */
  placeholder?: string;
}

/** A labelled select whose server-side error appears beside it, like Field. */
export function SelectField({ name, label, options, placeholder, className, ...select }: SelectFieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <FieldFrame id={id} label={label} errors={errors} className={className}>
      <select
        id={id}
        name={name}
        aria-invalid={errors ? true : undefined}
        aria-describedby={errors ? `${id}-error` : undefined}
        className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm shadow-xs aria-invalid:border-red-700"
        {...select}
      >
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}
