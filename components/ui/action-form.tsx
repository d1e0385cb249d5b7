"use client";

import {
  createContext,
  startTransition,
  useActionState,
  useContext,
  useEffect,
  useRef,
  useState,
  useSyncExternalStore,
  type FormEvent,
  type ReactNode,
} from "react";
import type { FormState } from "@/lib/actions/result";
import { fieldKeyLabel } from "@/lib/forms/field-key-label";

/**
 * The field names whose errors some control on the form shows. Controls claim their name once
 * mounted; the form lists every error nobody claimed, so a message for a field that is not on
 * screen (a hidden section, a group) is still read, named, beside the summary.
 */
function createClaims() {
  const counts = new Map<string, number>();
  const listeners = new Set<() => void>();
  let version = 0;
  const changed = () => {
    version++;
    listeners.forEach((l) => l());
  };
  return {
    claim(key: string) {
      counts.set(key, (counts.get(key) ?? 0) + 1);
      changed();
      return () => {
        const n = (counts.get(key) ?? 1) - 1;
        if (n <= 0) counts.delete(key);
        else counts.set(key, n);
        changed();
      };
    },
    has: (key: string) => counts.has(key),
    subscribe(listener: () => void) {
      listeners.add(listener);
      return () => void listeners.delete(listener);
    },
    snapshot: () => version,
  };
}
type Claims = ReturnType<typeof createClaims>;

const noClaim = () => () => {};
/** Exported for tests of the input kit, which render a control inside a given result. */
export const FormStateContext = createContext<{
  state: FormState;
  pending: boolean;
  claim: (key: string) => () => void;
}>({ state: null, pending: false, claim: noClaim });

export function useFormResult() {
  return useContext(FormStateContext);
}

/**
 * The banner's text: the summary, then every field error no control shows. When the summary is
 * word for word the error a control shows beside itself (a wrong password), the banner points to
 * that control instead of saying it twice; a service's error filed under a field no control shows
 * repeats the summary, and is said once too.
 */
function BannerText({
  claims,
  fieldErrors,
  summary,
  focusField,
}: {
  claims: Claims;
  fieldErrors: Record<string, string[]>;
  summary: string;
  focusField: (key: string) => void;
}) {
  useSyncExternalStore(claims.subscribe, claims.snapshot, claims.snapshot);
  const errors = Object.entries(fieldErrors).map(([key, messages]) => ({
    key,
    text: messages.join(" "),
    shownBeside: claims.has(key),
  }));
  const pointTo = errors.find((e) => e.shownBeside && e.text === summary);
  const rest = errors.filter((e) => !e.shownBeside && e.text !== summary);
  return (
    <>
      <p>
        {pointTo ? (
          <>
            One field needs attention:{" "}
            <button
              type="button"
              className="font-medium underline underline-offset-2 hover:text-red-700"
              onClick={() => focusField(pointTo.key)}
            >
              {fieldKeyLabel(pointTo.key)}
            </button>
            .
          </>
        ) : (
          summary
        )}
      </p>
      {rest.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {rest.map(({ key, text }) => (
            <li key={key}>{key === "_form" ? text : `${fieldKeyLabel(key)}: ${text}`}</li>
          ))}
        </ul>
      )}
    </>
  );
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
export function ActionForm<S extends FormState>({
  action,
  children,
  className,
  showSuccess = true,
  resetOnSuccess = false,
  ...rest
}: ActionFormProps<S>) {
  const [state, dispatch, pending] = useActionState<S, FormData>(action, null as Awaited<S>);
  const [claims] = useState(createClaims);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (resetOnSuccess && state?.ok) form.current?.reset();
  }, [state, resetOnSuccess]);
  /** Takes the user to the control named `key`: the banner's pointer to the field in question. */
  function focusField(key: string) {
    const named = form.current?.elements.namedItem(key);
    const control = named instanceof RadioNodeList ? named[0] : named;
    if (control instanceof HTMLElement) {
      control.focus();
      control.scrollIntoView({ block: "center" });
    }
  }
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    startTransition(() => dispatch(data));
  }
  return (
    <FormStateContext.Provider value={{ state, pending, claim: claims.claim }}>
      {/* POST even before the page's script runs: a form left to the browser's default (GET)
          would put what was typed, a password too, into the address, its history and logs. */}
      <form
        ref={form}
        method="post"
        onSubmit={onSubmit}
        className={className}
        noValidate
        aria-label={rest["aria-label"]}
      >
        {state && !state.ok && (
          <div
            role="alert"
            className="col-span-full mb-4 rounded-md border border-red-300 bg-red-50 px-3 py-2 text-sm text-red-900"
          >
            <BannerText
              claims={claims}
              fieldErrors={state.fieldErrors ?? {}}
              summary={state.message}
              focusField={focusField}
            />
          </div>
        )}
        {showSuccess && state?.ok && state.message && (
          <p
            role="status"
            className="col-span-full mb-4 rounded-md border border-brand-300 bg-brand-50 px-3 py-2 text-sm text-brand-900"
          >
            {state.message}
          </p>
        )}
        {children}
      </form>
    </FormStateContext.Provider>
  );
}
