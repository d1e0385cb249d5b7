"use client";

import { createContext, startTransition, useActionState, useContext, useEffect, useRef, type FormEvent, type ReactNode } from "react";
import type { FormState } from "@/lib/actions/result";

const FormStateContext = createContext<{ state: FormState; pending: boolean }>({ state: null, pending: false });

export function useFormResult() {
  return useContext(FormStateContext);
}

export interface ActionFormProps<S extends FormState> {
  action: (prev: S, formData: FormData) => Promise<S>;
  children: ReactNode;
  className?: string;
  /** Shown above the fields when the server accepted the submission. */
  showSuccess?: boolean;
  /** Clear the fields once the server accepted them (forms that add one record after another). */
  resetOnSuccess?: boolean;
  "aria-label"?: string;
}

/**
 * A form bound to a server action. It submits through a transition rather than
 * the form's own action, so React does not reset the fields: on a validation
 * error everything the user typed stays where it was.
 */
export function ActionForm<S extends FormState>({ action, children, className, showSuccess = true, resetOnSuccess = false, ...rest }: ActionFormProps<S>) {
  const [state, dispatch, pending] = useActionState<S, FormData>(action, null as Awaited<S>);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (resetOnSuccess && state?.ok) form.current?.reset();
  }, [state, resetOnSuccess]);
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    startTransition(() => dispatch(data));
  }
  return (
    <FormStateContext.Provider value={{ state, pending }}>
      <form ref={form} onSubmit={onSubmit} className={className} noValidate aria-label={rest["aria-label"]}>
        {state && !state.ok && (
          <p role="alert" className="mb-4 rounded-md border border-red-300 bg-red-50 px-3 py-2 text-sm text-red-900">
            {state.message}
          </p>
        )}
        {showSuccess && state?.ok && state.message && (
          <p role="status" className="mb-4 rounded-md border border-brand-300 bg-brand-50 px-3 py-2 text-sm text-brand-900">
            {state.message}
          </p>
        )}
        {children}
      </form>
    </FormStateContext.Provider>
  );
}
