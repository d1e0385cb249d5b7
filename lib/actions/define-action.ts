import "server-only";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import type { z } from "zod";
import { unknownFieldErrors, unknownFieldsMessage, unknownFormFields } from "@/lib/api/strict-keys";
import {
  declareEndpoint,
  permissionFor,
  type Declared,
  type PermissionSwitch,
} from "@/lib/auth/endpoint-rule";
import type { Permission } from "@/lib/auth/permissions";
import { deliverSoon } from "@/lib/email/deliver";
import { authorize } from "@/lib/server/auth/current-user";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { toActionFailure } from "@/lib/server/errors";
import { invalid, readJsonPayload, type ActionResult } from "./result";
import { readForm } from "./read-form";

/** A path to revalidate, or a path with its type ("layout" refreshes every page under it). */
export type RevalidateTarget = string | readonly [string, "layout" | "page"];

/**
 * What `run` hands back: a message (and any extra fields the form shows, such as a new token), or
 * `redirect` to go to another page once the change is committed, or a refusal it decided itself.
 */
export type RunResult =
  | { ok?: true; message?: string; redirect?: string }
  | { ok: false; message: string; fieldErrors?: Record<string, string[]> };

type Extras<R> = R extends { ok: false } ? never : Omit<R, "ok" | "redirect" | "message">;
/** The state a form reads with useActionState: the ActionResult shape, plus any fields `run` added (a new token). */
export type ActionState<R> = (ActionResult & Partial<Extras<R>>) | null;

export interface ActionContext<I> {
  input: I;
  /** The form as read, for a second schema that depends on a record (a run's test type picks its sample schema). */
  raw: unknown;
  /** Parses with another schema; a failure answers with its field errors, like the main input. */
  parse<S extends z.ZodType>(schema: S, value?: unknown): z.output<S>;
}

interface Common<S extends z.ZodType, R extends RunResult> {
  input: S;
  /** "form" (default): the form's fields; "payload": the JSON the row editors put in one field. */
  from?: "form" | "payload";
  /**
   * Schemas the form's other fields are read with: one `parse` picks once the record is known, or
   * a field the page sends only to say what to refresh. Any other key of the form is refused.
   */
  alsoReads?: readonly z.ZodType[];
  /** The headline when the input fails its schema; the field errors go beside the fields. */
  invalidMessage?: string;
  /** Pages to refresh after a success; a function gets the parsed input, `run`'s result and the form as read. */
  revalidate?:
    | readonly RevalidateTarget[]
    | ((
        input: z.output<S>,
        result: Exclude<R, { ok: false }>,
        raw: unknown,
      ) => readonly RevalidateTarget[]);
  /** The step queued e-mail in its transaction: send it once the change is committed. */
  sendsMail?: boolean;
}

export interface DefineActionOptions<S extends z.ZodType, R extends RunResult> extends Common<
  S,
  R
> {
  permission: Permission;
  /** A field whose value switches to another permission, declared so the registry and tests see it. */
  when?: PermissionSwitch;
  run: (ctx: ActionContext<z.output<S>> & { user: SessionUser }) => Promise<R>;
}

export interface DefinePublicActionOptions<S extends z.ZodType, R extends RunResult> extends Common<
  S,
  R
> {
  run: (ctx: ActionContext<z.output<S>>) => Promise<R>;
}

export type FormAction<R> = (prev: ActionState<R>, formData: FormData) => Promise<ActionState<R>>;

class InputRefused extends Error {
  constructor(readonly result: ActionResult) {
    super(result.ok ? "" : result.message);
  }
}

function readRaw(
  formData: unknown,
  from: "form" | "payload",
  schema: z.ZodType,
): { ok: true; value: unknown } | { ok: false; message: string } {
  // A caller can post anything to an action's id: a body that is not a form is refused, never thrown on.
  if (!(formData instanceof FormData))
    return {
      ok: false,
      message: "The form could not be read. Reload the page; nothing was saved.",
    };
  return from === "payload"
    ? readJsonPayload(formData)
    : { ok: true, value: readForm(formData, schema) };
}

function field(raw: unknown, name: string): unknown {
  return raw && typeof raw === "object" ? (raw as Record<string, unknown>)[name] : undefined;
}

function refreshAll(targets: readonly RevalidateTarget[]) {
  for (const t of targets) {
    if (typeof t === "string") revalidatePath(t);
    else revalidatePath(t[0], t[1]);
  }
}

/** Parse → run → map the error → revalidate → redirect: the same for every action once access is decided. */
async function perform<S extends z.ZodType, R extends RunResult>(
  options: Common<S, R>,
  raw: unknown,
  run: (ctx: ActionContext<z.output<S>>) => Promise<R>,
): Promise<ActionState<R>> {
  // A key the action does not read is refused by name, never dropped, whether the body is a JSON
  // payload (like an API body) or a form's fields (which may also be read by `alsoReads`).
  const extra =
    options.from === "payload"
      ? unknownFieldErrors(options.input, raw)
      : unknownFormFields(options.input, raw, options.alsoReads);
  if (extra)
    return {
      ok: false,
      message: unknownFieldsMessage(extra),
      fieldErrors: extra,
    } as ActionState<R>;
  const parsed = options.input.safeParse(raw);
  if (!parsed.success) return invalid(parsed.error, options.invalidMessage) as ActionState<R>;
  const input = parsed.data as z.output<S>;
  const parse = <T extends z.ZodType>(schema: T, value: unknown = raw): z.output<T> => {
    // The value also holds the fields the action's own input read (the run's id); any other key is
    // one neither schema reads.
    const misnamed = unknownFormFields(schema, value, [options.input]);
    if (misnamed)
      throw new InputRefused({
        ok: false,
        message: unknownFieldsMessage(misnamed),
        fieldErrors: misnamed,
      });
    const again = schema.safeParse(value);
    if (!again.success) throw new InputRefused(invalid(again.error, options.invalidMessage));
    return again.data;
  };
  let result: R;
  try {
    result = await run({ input, raw, parse });
  } catch (error) {
    if (error instanceof InputRefused) return error.result as ActionState<R>;
    return toActionFailure(error) as ActionState<R>;
  }
  if (result.ok === false) return result as ActionState<R>;
  if (options.sendsMail) deliverSoon();
  const targets =
    typeof options.revalidate === "function"
      ? options.revalidate(input, result as Exclude<R, { ok: false }>, raw)
      : (options.revalidate ?? []);
  refreshAll(targets);
  const { redirect: to, ...rest } = result as { redirect?: string } & Record<string, unknown>;
  // redirect() throws Next's own signal, so it comes after everything else and outside the try.
  if (to) redirect(to);
  return { ...rest, ok: true } as ActionState<R>;
}

/**
 * The one way to write a server action used by a form: access is decided before the input is
 * read (a refused caller learns nothing from validation), then the input is parsed with its zod
 * schema, `run` calls the service, and the pages named in `revalidate` are refreshed.
 */
export function defineAction<S extends z.ZodType, R extends RunResult>(
  options: DefineActionOptions<S, R>,
): Declared<FormAction<R>> {
  const from = options.from ?? "form";
  const action = async (_prev: ActionState<R>, formData: FormData): Promise<ActionState<R>> => {
    const raw = readRaw(formData, from, options.input);
    // Only the switching field is looked at before access is decided, never validated.
    const permission = permissionFor(options, (name) =>
      raw.ok ? field(raw.value, name) : undefined,
    );
    const auth = await authorize(permission);
    if (!auth.ok) return auth as ActionState<R>;
    if (!raw.ok) return raw as ActionState<R>;
    return perform(options, raw.value, (ctx) => options.run({ ...ctx, user: auth.user }));
  };
  return declareEndpoint(action, {
    auth: "session",
    permission: options.permission,
    ...(options.when ? { when: options.when } : {}),
  });
}

/** The same for the few actions anyone may call (signing in). */
export function definePublicAction<S extends z.ZodType, R extends RunResult>(
  options: DefinePublicActionOptions<S, R>,
): Declared<FormAction<R>> {
  const from = options.from ?? "form";
  const action = async (_prev: ActionState<R>, formData: FormData): Promise<ActionState<R>> => {
    const raw = readRaw(formData, from, options.input);
    if (!raw.ok) return raw as ActionState<R>;
    return perform(options, raw.value, options.run);
  };
  return declareEndpoint(action, { auth: "public" });
}

/**
 * An action the client calls with a plain object rather than a form (the editor's autosave). Its
 * answer is whatever `run` returns; a refusal keeps the ActionResult shape.
 */
export function defineCallAction<S extends z.ZodType, R>(options: {
  permission: Permission;
  input: S;
  run: (ctx: { user: SessionUser; input: z.output<S> }) => Promise<R>;
}): Declared<
  (
    input: z.input<S>,
  ) => Promise<R | { ok: false; message: string; fieldErrors?: Record<string, string[]> }>
> {
  const action = async (input: z.input<S>) => {
    const auth = await authorize(options.permission);
    if (!auth.ok) return { ok: false as const, message: auth.message, status: auth.status };
    const parsed = options.input.safeParse(input);
    if (!parsed.success) {
      const failure = invalid(parsed.error);
      return {
        ...failure,
        message: parsed.error.issues[0]?.message ?? "The input could not be read.",
      } as { ok: false; message: string };
    }
    try {
      return await options.run({ user: auth.user, input: parsed.data });
    } catch (error) {
      return toActionFailure(error);
    }
  };
  return declareEndpoint(action, { auth: "session", permission: options.permission });
}
