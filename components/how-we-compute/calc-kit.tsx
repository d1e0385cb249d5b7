"use client";

import { CircleCheck, CircleX } from "lucide-react";
import type { ReactNode } from "react";

/** Text typed into a calculator field as a number: blank is "not given", a decimal comma is accepted. */
export function parseInput(text: string): number | undefined {
  const trimmed = text.trim();
  if (trimmed === "") return undefined;
  return Number(trimmed.replace(",", "."));
}

/** Like parseInput, but blank counts as NaN so the computation reports the missing value. */
export function requiredInput(text: string): number {
  return parseInput(text) ?? Number.NaN;
}

export type Outcome<T> = { ok: true; value: T } | { ok: false; message: string; field?: string };

/**
 * Runs a computation and turns its error into a message for the page: the calculators must never
 * crash, and the functions' own messages say what is wrong.
 */
export function attempt<T>(compute: () => T): Outcome<T> {
  try {
    return { ok: true, value: compute() };
  } catch (error) {
    const field = (error as { field?: unknown }).field;
    return {
      ok: false,
      message: error instanceof Error ? error.message : "The computation failed.",
      field: typeof field === "string" ? field : undefined,
    };
  }
}

/** The error of an outcome if it belongs to one of the given fields. */
export function errorFor(outcome: Outcome<unknown>, ...fields: string[]): string | undefined {
  return !outcome.ok && outcome.field !== undefined && fields.includes(outcome.field)
    ? outcome.message
    : undefined;
}

/** The error of an outcome that no field on the form shows. */
export function generalError(
  outcome: Outcome<unknown>,
  shownFields: readonly string[],
): string | undefined {
  if (outcome.ok) return undefined;
  return outcome.field !== undefined && shownFields.includes(outcome.field)
    ? undefined
    : outcome.message;
}

/** Pass or fail as a word with an icon, never by colour alone. */
export function Verdict({
  pass,
  passWord = "Pass",
  failWord = "Fail",
}: {
  pass: boolean;
  passWord?: string;
  failWord?: string;
}) {
  const Icon = pass ? CircleCheck : CircleX;
  return (
    <span
      className={`inline-flex items-center gap-1 font-semibold ${pass ? "text-brand-700" : "text-red-800"}`}
    >
      <Icon className="h-4 w-4" aria-hidden="true" />
      {pass ? passWord : failWord}
    </span>
  );
}

/** A computation error not tied to one field; the result area around it is a polite live region. */
export function CalcError({ message }: { message?: string }) {
  if (!message) return null;
  return (
    <p className="rounded-md border border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800">
      {message}
    </p>
  );
}

/** The frame every calculator shares: a form on the left, the working on the right. */
export function CalcPanel({
  title,
  form,
  result,
}: {
  title: string;
  form: ReactNode;
  result: ReactNode;
}) {
  return (
    <section aria-label={title} className="mt-4 rounded-lg border border-stone-200 bg-white">
      <h4 className="border-b border-stone-200 bg-stone-50 px-4 py-2 text-sm font-semibold text-stone-800">
        {title}
      </h4>
      <div className="grid gap-6 p-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
        <div className="space-y-4">{form}</div>
        <div aria-live="polite" className="min-w-0 space-y-3">
          {result}
        </div>
      </div>
    </section>
  );
}

/** Numbers for display with a fixed number of decimals; never hides the unit. */
export function fixed(value: number, decimals: number): string {
  return Number.isFinite(value) ? value.toFixed(decimals) : String(value);
}
