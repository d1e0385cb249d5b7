import type { z } from "zod";
import "@/lib/schemas/messages";

/** The one result shape of every server action, read by forms with useActionState. */
export type ActionResult =
  | { ok: true; message?: string }
  | { ok: false; message: string; fieldErrors?: Record<string, string[]> };

/** What a form holds before its first submission. */
export type FormState = ActionResult | null;

export function invalid(error: z.ZodError, message = "Some fields need attention."): ActionResult {
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_form";
    (fieldErrors[key] ??= []).push(issue.message);
  }
  return { ok: false, message, fieldErrors };
}

/** Editors that keep their rows in client state submit them as one JSON field, "payload". */
export function readJsonPayload(
  formData: FormData,
): { ok: true; value: unknown } | { ok: false; message: string } {
  try {
    return { ok: true, value: JSON.parse(String(formData.get("payload") ?? "null")) };
  } catch {
    return {
      ok: false,
      message: "The form could not be read. Reload the page; nothing was saved.",
    };
  }
}
