import type { SignatureMeaning } from "@/db/enums";

export interface ExistingSignature {
  userId: string;
  meaning: SignatureMeaning;
  contentHash: string;
}

/**
 * Meanings one person may never both give on the same record version: the author
 * does not approve their own work, the performer does not verify their own test.
 */
const EXCLUSIVE_PAIRS: [SignatureMeaning, SignatureMeaning][] = [
  ["authored", "approved"],
  ["performed", "verified"],
];

/** Why this signature may not be applied, or null when it may. */
export function segregationProblem(existing: ExistingSignature[], next: { userId: string; meaning: SignatureMeaning }): string | null {
  const mine = existing.filter((s) => s.userId === next.userId).map((s) => s.meaning);
  if (mine.includes(next.meaning)) return `You have already signed this version as "${next.meaning}".`;
  for (const [a, b] of EXCLUSIVE_PAIRS) {
    const other = next.meaning === a ? b : next.meaning === b ? a : null;
    if (other && mine.includes(other)) {
      return `You signed this version as "${other}", so another person must sign it as "${next.meaning}".`;
    }
  }
  return null;
}

/** A signature holds only while the record's content still hashes to what was signed (21 CFR 11.70). */
export function signatureValidity(signedHash: string, currentHash: string | null): "valid" | "invalid" {
  return currentHash !== null && signedHash === currentHash ? "valid" : "invalid";
}

export const MEANING_LABELS: Record<SignatureMeaning, string> = {
  authored: "Authored",
  reviewed: "Reviewed",
  approved: "Approved",
  performed: "Performed",
  verified: "Verified",
};

/** The statement the signer affirms, shown in the signing dialog and on printouts (§11.50). */
export const MEANING_STATEMENTS: Record<SignatureMeaning, string> = {
  authored: "I am the author of this version and submit it as written.",
  reviewed: "I have reviewed this version and find it fit for approval.",
  approved: "I approve this version.",
  performed: "I performed this test as recorded, and the data entered are the data observed.",
  verified: "I have checked the recorded data and evidence of this test against its requirements.",
};
