"use client";

import { useId, type ReactNode, type SelectHTMLAttributes } from "react";
import { describedBy, FieldFrame, useFieldErrors } from "./field";

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  name: string;
  label: string;
  hint?: ReactNode;
  options: { value: string; label: string }[];
  /** Text of an empty first option, e.g. "Choose…". */
  placeholder?: string;
}

/** A labelled select whose server-side error appears beside it, like Field. */
export function SelectField({ name, label, hint, options, placeholder, className, ...select }: SelectFieldProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} errors={errors} className={className}>
      <select
        id={id}
        name={name}
        aria-invalid={errors ? true : undefined}
        aria-describedby={describedBy(id, hint, errors)}
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
