"use client";

import "@/lib/schemas/messages";
import {
  useEffect,
  useId,
  useRef,
  type ChangeEvent,
  type InputHTMLAttributes,
  type ReactNode,
  type SelectHTMLAttributes,
  type TextareaHTMLAttributes,
} from "react";
import { useFormResult } from "./action-form";

/*
 * The one input kit. Every control has a label (visible, or kept for screen readers in a table
 * cell), an optional hint, and the server's error for its own field right beside it. A control
 * works uncontrolled (`name` + `defaultValue`, read from the submitted form) or controlled
 * (`value` + `onValueChange`, for editors that submit one JSON payload and name their errors with
 * `errorKey`, the path the schema reports, e.g. "stages.0.name").
 */

/** The server's errors for one field of the enclosing ActionForm; the form lists any no control claims. */
export function useFieldErrors(key: string | undefined): string[] | undefined {
  const { state, claim } = useFormResult();
  useEffect(() => (key ? claim(key) : undefined), [key, claim]);
  return key && state && !state.ok ? state.fieldErrors?.[key] : undefined;
}

/** The ids a control's aria-describedby names: its hint and its errors. */
export function describedBy(id: string, hint: ReactNode | undefined, errors: string[] | undefined) {
  return (
    [hint ? `${id}-hint` : null, errors ? `${id}-error` : null].filter(Boolean).join(" ") ||
    undefined
  );
}

/** The hint and the errors under a control. */
export function FieldMessages({
  id,
  hint,
  errors,
}: {
  id: string;
  hint?: ReactNode;
  errors?: string[];
}) {
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

/** What every control of the kit takes besides its element's own attributes. */
export interface ControlProps {
  label: string;
  hint?: ReactNode;
  /** Keep the label for screen readers only, where a column header already shows it. */
  hideLabel?: boolean;
  /** Where this control's server errors are filed when that is not its `name`. */
  errorKey?: string;
  /** An error found in the browser (the calculators), shown like the server's. */
  error?: string;
  /** Called with the new text on every change (controlled use). */
  onValueChange?: (value: string) => void;
  /** Compact padding for table cells. */
  dense?: boolean;
  className?: string;
}

function useControl(props: { name?: string; errorKey?: string; error?: string }) {
  const id = useId();
  const serverErrors = useFieldErrors(props.errorKey ?? props.name);
  const errors = props.error ? [props.error] : serverErrors;
  return { id, errors, invalid: errors ? (true as const) : undefined };
}

const box =
  "block rounded-md border border-stone-300 bg-white text-sm shadow-xs focus:border-brand-600 aria-invalid:border-red-700 disabled:cursor-not-allowed disabled:bg-stone-100 disabled:text-stone-500";
const boxClass = (dense?: boolean) => `${box} ${dense ? "px-2 py-1" : "px-3 py-2"}`;

/** Label above, the control, then hint and errors: the frame every field shares. */
export function FieldFrame(props: {
  id: string;
  label: string;
  hint?: ReactNode;
  errors?: string[];
  hideLabel?: boolean;
  className?: string;
  children: ReactNode;
}) {
  return (
    <div className={`space-y-1 ${props.className ?? ""}`}>
      <label
        htmlFor={props.id}
        className={props.hideLabel ? "sr-only" : "block text-sm font-medium text-stone-800"}
      >
        {props.label}
      </label>
      {props.children}
      <FieldMessages id={props.id} hint={props.hint} errors={props.errors} />
    </div>
  );
}

function changeHandler<E extends HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>(
  onChange: ((e: ChangeEvent<E>) => void) | undefined,
  onValueChange: ((v: string) => void) | undefined,
) {
  if (!onChange && !onValueChange) return undefined;
  return (e: ChangeEvent<E>) => {
    onChange?.(e);
    onValueChange?.(e.target.value);
  };
}

export interface FieldProps
  extends ControlProps, Omit<InputHTMLAttributes<HTMLInputElement>, "className"> {
  name?: string;
  /** Shown after the box, e.g. "cm²"; the label names it too where a test or reader needs it. */
  unit?: string;
}

/** A labelled single-line text input (also e-mail, password, search). */
export function Field(props: FieldProps) {
  return <TextBox {...props} />;
}

function TextBox({
  name,
  label,
  hint,
  hideLabel,
  errorKey,
  error,
  onValueChange,
  dense,
  className,
  onChange,
  unit,
  boxClassName = "",
  ...input
}: FieldProps & { boxClassName?: string }) {
  const { id, errors, invalid } = useControl({ name, errorKey, error });
  const element = useRef<HTMLInputElement>(null);
  // A password the server refused is emptied for the next try, as a sign-in page does: no one
  // types on after a wrong one. Refused means its own error, or a refusal that names no field (a
  // sign-in does not say which of the two was wrong); an error on another field keeps it.
  const { state } = useFormResult();
  const namesNoField = Object.keys((state && !state.ok && state.fieldErrors) || {}).length === 0;
  const refusal =
    input.autoComplete === "current-password" && state && !state.ok && (errors || namesNoField)
      ? state
      : null;
  useEffect(() => {
    if (refusal && element.current) element.current.value = "";
  }, [refusal]);
  const box = (
    <input
      ref={element}
      id={id}
      name={name}
      aria-invalid={invalid}
      aria-describedby={describedBy(id, hint, errors)}
      className={`${boxClass(dense)} w-full ${boxClassName}`}
      onChange={changeHandler(onChange, onValueChange)}
      {...input}
    />
  );
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      errors={errors}
      hideLabel={hideLabel}
      className={className}
    >
      {unit ? (
        <div className="flex items-center gap-2">
          {box}
          <span className="shrink-0 text-sm text-stone-600">{unit}</span>
        </div>
      ) : (
        box
      )}
    </FieldFrame>
  );
}

export interface NumberFieldProps extends FieldProps {
  /** Whole numbers only (counts): the phone keyboard shows digits only. */
  integer?: boolean;
}

/**
 * A number typed as text, so a decimal comma and an empty "not measured" survive to the schema,
 * which parses it. The box is never narrower than six digits and a sign.
 */
export function NumberField({ integer, ...props }: NumberFieldProps) {
  return (
    <TextBox
      type="text"
      inputMode={integer ? "numeric" : "decimal"}
      autoComplete="off"
      {...props}
      boxClassName="min-w-[calc(7ch+1.5rem)] tabular-nums"
    />
  );
}

export interface DateFieldProps extends FieldProps {
  /** Date and time (bath log entries) rather than a day. */
  withTime?: boolean;
}

/** A day (YYYY-MM-DD) or, with `withTime`, a date and time, in the browser's own picker. */
export function DateField({ withTime, ...props }: DateFieldProps) {
  return (
    <Field
      type={withTime ? "datetime-local" : "date"}
      {...props}
      className={`max-w-xs ${props.className ?? ""}`}
    />
  );
}

export interface SelectFieldProps
  extends ControlProps, Omit<SelectHTMLAttributes<HTMLSelectElement>, "className"> {
  name?: string;
  options: readonly { value: string; label: string }[];
  /** Labelled groups of options, listed after `options`. */
  groups?: readonly { label: string; options: readonly { value: string; label: string }[] }[];
  /** Text of an empty first option, e.g. "Choose…". */
  placeholder?: string;
}

/** A labelled select. */
export function SelectField({
  name,
  label,
  hint,
  hideLabel,
  errorKey,
  error,
  onValueChange,
  dense,
  options,
  groups = [],
  placeholder,
  className,
  onChange,
  ...select
}: SelectFieldProps) {
  const { id, errors, invalid } = useControl({ name, errorKey, error });
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      errors={errors}
      hideLabel={hideLabel}
      className={className}
    >
      <select
        id={id}
        name={name}
        aria-invalid={invalid}
        aria-describedby={describedBy(id, hint, errors)}
        className={`${boxClass(dense)} w-full`}
        onChange={changeHandler(onChange, onValueChange)}
        {...select}
      >
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
        {groups.map((g) => (
          <optgroup key={g.label} label={g.label}>
            {g.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </optgroup>
        ))}
      </select>
    </FieldFrame>
  );
}

export interface TextareaFieldProps
  extends ControlProps, Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, "className"> {
  name?: string;
}

/** A labelled multi-line input. */
export function TextareaField({
  name,
  label,
  hint,
  hideLabel,
  errorKey,
  error,
  onValueChange,
  dense,
  className,
  rows = 3,
  onChange,
  ...textarea
}: TextareaFieldProps) {
  const { id, errors, invalid } = useControl({ name, errorKey, error });
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      errors={errors}
      hideLabel={hideLabel}
      className={className}
    >
      <textarea
        id={id}
        name={name}
        rows={rows}
        aria-invalid={invalid}
        aria-describedby={describedBy(id, hint, errors)}
        className={`${boxClass(dense)} w-full`}
        onChange={changeHandler(onChange, onValueChange)}
        {...textarea}
      />
    </FieldFrame>
  );
}

export interface CheckboxFieldProps
  extends
    Omit<ControlProps, "onValueChange" | "dense">,
    Omit<InputHTMLAttributes<HTMLInputElement>, "className" | "type"> {
  name?: string;
  /** Called with the new state on every change (controlled use). */
  onCheckedChange?: (checked: boolean) => void;
}

/** A checkbox with its label to the right, and its error under it. */
export function CheckboxField({
  name,
  label,
  hint,
  hideLabel,
  errorKey,
  error,
  onCheckedChange,
  className,
  onChange,
  ...input
}: CheckboxFieldProps) {
  const { id, errors, invalid } = useControl({ name, errorKey, error });
  return (
    <div className={`space-y-1 ${className ?? ""}`}>
      <div className="flex items-center gap-2 text-sm">
        <input
          id={id}
          name={name}
          type="checkbox"
          aria-invalid={invalid}
          aria-describedby={describedBy(id, hint, errors)}
          onChange={(e) => {
            onChange?.(e);
            onCheckedChange?.(e.target.checked);
          }}
          {...input}
        />
        <label htmlFor={id} className={hideLabel ? "sr-only" : undefined}>
          {label}
        </label>
      </div>
      <FieldMessages id={id} hint={hint} errors={errors} />
    </div>
  );
}

export interface ChoiceGroupProps {
  /** Radios pick one value; checkboxes submit every ticked value under the one name. */
  type: "radio" | "checkbox";
  name: string;
  legend: string;
  options: readonly { value: string; label: ReactNode }[];
  /** The ticked values when the form opens. */
  defaultValues?: readonly string[];
  hint?: ReactNode;
  /** Lay the options out in a row instead of one per line. */
  inline?: boolean;
  className?: string;
  /** Controlled radios (the calculators): the picked value and its setter. */
  value?: string;
  onValueChange?: (value: string) => void;
}

/** A fieldset of radios or checkboxes under one name, with the server's error for that name. */
export function ChoiceGroup({
  type,
  name,
  legend,
  options,
  defaultValues = [],
  hint,
  inline,
  className,
  value,
  onValueChange,
}: ChoiceGroupProps) {
  const id = useId();
  const errors = useFieldErrors(name);
  return (
    <fieldset
      className={`space-y-1 ${className ?? ""}`}
      aria-describedby={describedBy(id, hint, errors)}
    >
      <legend className="text-sm font-medium text-stone-800">{legend}</legend>
      <div className={inline ? "flex flex-wrap gap-x-4 gap-y-1" : "space-y-1"}>
        {options.map((o) => (
          <label key={o.value} className="flex items-start gap-2 text-sm">
            <input
              type={type}
              name={name}
              value={o.value}
              className="mt-0.5"
              {...(value === undefined
                ? { defaultChecked: defaultValues.includes(o.value) }
                : { checked: value === o.value, onChange: () => onValueChange?.(o.value) })}
            />
            <span>{o.label}</span>
          </label>
        ))}
      </div>
      <FieldMessages id={id} hint={hint} errors={errors} />
    </fieldset>
  );
}

export interface FileFieldProps
  extends
    Omit<ControlProps, "onValueChange" | "dense">,
    Omit<InputHTMLAttributes<HTMLInputElement>, "className" | "type"> {
  name?: string;
}

/** A labelled file picker. */
export function FileField({
  name,
  label,
  hint,
  hideLabel,
  errorKey,
  error,
  className,
  ...input
}: FileFieldProps) {
  const { id, errors, invalid } = useControl({ name, errorKey, error });
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      errors={errors}
      hideLabel={hideLabel}
      className={className}
    >
      <input
        id={id}
        name={name}
        type="file"
        aria-invalid={invalid}
        aria-describedby={describedBy(id, hint, errors)}
        className="block w-full text-sm"
        {...input}
      />
    </FieldFrame>
  );
}

/** The server's errors for a name no single control shows (a group, a whole row). */
export function FieldError({ name }: { name: string }) {
  const errors = useFieldErrors(name);
  if (!errors) return null;
  return <p className="text-sm text-red-800">{errors.join(" ")}</p>;
}
