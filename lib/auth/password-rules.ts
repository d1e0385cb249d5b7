import { ZxcvbnFactory } from "@zxcvbn-ts/core";
import { adjacencyGraphs, dictionary } from "@zxcvbn-ts/language-common";

/**
 * What a new password must be, beyond its length (lib/schemas/account.ts): not the
 * person's name or e-mail, and not easy to guess by the zxcvbn estimator (score 3
 * of 4 or more: "safely unguessable", under 10^10 guesses, the estimator's own scale).
 * Pure; returns the plain message for the first rule broken, or null.
 */
export const MIN_SCORE = 3;

let estimator: ZxcvbnFactory | undefined;
function zxcvbn() {
  // Built once: loading the dictionaries is the expensive part.
  estimator ??= new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs });
  return estimator;
}

/** The estimator's warnings are keys (no translation package): plain words for each one it gives. */
const WARNINGS: Record<string, string> = {
  commonPasswords: "it is one of the most used passwords",
  similarToCommon: "it is close to one of the most used passwords",
  topTen: "it is one of the ten most used passwords",
  topHundred: "it is one of the hundred most used passwords",
  userInputs: "it contains your name or e-mail address",
  simpleRepeat: "it repeats the same character",
  extendedRepeat: "it repeats the same characters",
  sequences: "it follows a sequence such as abc or 1234",
  straightRow: "it follows a row of the keyboard",
  keyPattern: "it follows a pattern on the keyboard",
  recentYears: "it relies on a recent year",
  dates: "it relies on a date",
  namesByThemselves: "it relies on common names",
  wordByItself: "a single word is easy to guess",
};

/** The parts of a person's identity that must not make up their password. */
function personalWords(person: { name: string; email: string }) {
  const email = person.email.trim().toLowerCase();
  const local = email.split("@")[0] ?? "";
  const nameParts = person.name
    .toLowerCase()
    .split(/[^\p{L}\p{N}]+/u)
    .filter((p) => p.length >= 3);
  return {
    email,
    local,
    name: person.name.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, ""),
    nameParts,
  };
}

export function passwordProblem(
  password: string,
  person: { name: string; email: string },
): string | null {
  if (password.trim() === "") return "Use letters, digits or symbols, not only spaces.";
  const words = personalWords(person);
  const plain = password.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, "");
  if (
    password.trim().toLowerCase() === words.email ||
    (words.local.length >= 4 && password.toLowerCase().includes(words.local))
  ) {
    return "The password must not be or contain your e-mail address.";
  }
  if (words.name.length >= 4 && plain.includes(words.name))
    return "The password must not contain your name.";
  const result = zxcvbn().check(password, [words.email, words.local, ...words.nameParts]);
  if (result.score < MIN_SCORE) {
    const why = result.feedback.warning ? WARNINGS[result.feedback.warning] : undefined;
    return `This password is too easy to guess${why ? `: ${why}` : ""}. Use a longer phrase of unrelated words, or add characters that follow no pattern.`;
  }
  return null;
}
