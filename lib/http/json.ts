import { NextResponse } from "next/server";
import "@/lib/schemas/messages";
import type { z } from "zod";

/** A JSON error body every route handler uses: a message a person can act on, and field details. */
export function jsonError(status: number, message: string, fieldErrors?: Record<string, string[]>) {
  return NextResponse.json(
    { error: message, ...(fieldErrors ? { fieldErrors } : {}) },
    { status, headers: { "Cache-Control": "no-store" } },
  );
}

export function zodFieldErrors(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[issue.path.join(".") || "_"] ??= []).push(issue.message);
  return out;
}

/** Query-string parameters as a plain object (repeated keys keep the last value). */
export function searchParamsObject(url: string): Record<string, string> {
  return Object.fromEntries(new URL(url).searchParams.entries());
}
