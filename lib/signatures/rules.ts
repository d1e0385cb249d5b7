import type { SignatureMeaning, SignedRecordType } from "@/db/enums";

export interface ExistingSignature {
  userId: string;
  meaning: SignatureMeaning;
  contentHash: string;
}

/**
 * Segregation of duties on one record, whatever roles a person holds: the author,
 * the reviewer, the approver and the verifier are different people, and whoever
 * performed a test does not verify it. A person may still sign the same meaning
 * on another record.
 */
const SEPARATE_DUTIES: readonly SignatureMeaning[][] = [
  ["authored", "reviewed", "approved", "verified"],
  ["performed", "verified"],
];

/**
 * Why this signature may not be applied, or null when it may. `existing` holds every
 * signature on the record (all its content versions): a duty taken on an earlier
 * hash of the same record still counts; a repeated meaning is refused on the same content.
 */
export function segregationProblem(
  existing: ExistingSignature[],
  next: { userId: string; meaning: SignatureMeaning; contentHash?: string },
): string | null {
  const mine = existing.filter((s) => s.userId === next.userId);
  if (
    mine.some(
      (s) =>
        s.meaning === next.meaning &&
        (next.contentHash === undefined || s.contentHash === next.contentHash),
    )
  ) {
    return `You have already signed this version as "${next.meaning}".`;
  }
  for (const group of SEPARATE_DUTIES) {
    if (!group.includes(next.meaning)) continue;
    const other = mine.find((s) => s.meaning !== next.meaning && group.includes(s.meaning));
    if (other) {
      return `Segregation of duties: you signed this record as "${other.meaning}", so another person must sign it as "${next.meaning}".`;
    }
  }
  return null;
}

/**
 * Whoever entered or changed a run's data does not verify it (the second-person check
 * means nothing if the checker typed the numbers). `entrants` are the people whose
 * edits to the run's data are on record.
 */
export function dataEntryProblem(entrants: readonly string[], verifierId: string): string | null {
  return entrants.includes(verifierId)
    ? "Segregation of duties: you entered data of this run, so another person must verify it."
    : null;
}

/** The person who verified a change, or authored it, does not also make it effective. */
export function closureProblem(
  signers: readonly { userId: string; meaning: SignatureMeaning }[],
  closerId: string,
): string | null {
  const own = signers.find(
    (s) => s.userId === closerId && (s.meaning === "verified" || s.meaning === "authored"),
  );
  return own
    ? `Segregation of duties: you signed this change as "${own.meaning}", so another person must close it.`
    : null;
}

/** A signature holds only while the record's content still hashes to what was signed (21 CFR 11.70). */
export function signatureValidity(
  signedHash: string,
  currentHash: string | null,
): "valid" | "invalid" {
  return currentHash !== null && signedHash === currentHash ? "valid" : "invalid";
}

export const MEANING_LABELS: Record<SignatureMeaning, string> = {
  authored: "Authored",
  reviewed: "Reviewed",
  approved: "Approved",
  performed: "Performed",
  verified: "Verified",
};

/**
 * The statement the signer affirms, shown in the signing dialog and on printouts (21 CFR 11.50:
 * the meaning of the signature). Each signed record type has its own wording: a change request's
 * "Verified" affirms the change was implemented as approved, not a test's data.
 */
export const MEANING_STATEMENTS: Record<SignedRecordType, Record<SignatureMeaning, string>> = {
  document_version: {
    authored: "I am the author of this version of the document and submit it as written.",
    reviewed: "I have reviewed this version of the document and find it fit for approval.",
    approved: "I approve this version of the document for use.",
    performed: "I carried out the work this document describes, as written.",
    verified: "I have checked this version of the document against its requirements.",
  },
  change_request: {
    authored:
      "I am the author of this change request and its impact assessment, and submit them as written.",
    reviewed:
      "I have reviewed this change request and its impact assessment and find them fit for approval.",
    approved: "I approve this change for implementation as assessed.",
    performed: "I implemented this change as approved.",
    verified:
      "I have checked that this change was implemented as approved and that its requalification evidence meets the requirements.",
  },
  test_run: {
    authored: "I planned this test as recorded.",
    reviewed: "I have reviewed the recorded data and evidence of this test.",
    approved: "I approve the result of this test.",
    performed: "I performed this test as recorded, and the data entered are the data observed.",
    verified:
      "I have checked the recorded data and evidence of this test against its requirements.",
  },
  recipe_version: {
    authored: "I am the author of this recipe version and submit it as written.",
    reviewed: "I have reviewed this recipe version and find it fit for approval.",
    approved: "I approve this recipe version for production.",
    performed: "I ran this recipe version as recorded.",
    verified: "I have checked this recipe version against its validated ranges.",
  },
  deviation: {
    authored:
      "I am the author of this temporary deviation, its scope, justification and risk, and submit it as written.",
    reviewed: "I have reviewed this temporary deviation and find it fit for approval.",
    approved:
      "I approve running outside the validated range as this deviation states, within its limits and until it ends.",
    performed: "I ran production under this deviation as recorded.",
    verified: "I have checked that production under this deviation kept to its temporary values.",
  },
  nonconformance: {
    authored:
      "I am the author of this nonconformance's investigation and submit it for closure: containment, dispositions, root cause, actions and effectiveness check as recorded.",
    reviewed: "I have reviewed this nonconformance as recorded.",
    approved:
      "I approve the closure of this nonconformance: the affected product is dispositioned and the actions were shown effective.",
    performed: "I carried out the actions of this nonconformance as recorded.",
    verified: "I have checked this nonconformance's records against its requirements.",
  },
  control_plan_version: {
    authored:
      "I am the author of this control plan version, its tests, frequencies and reaction plans, and submit it as written.",
    reviewed: "I have reviewed this control plan version and find it fit for approval.",
    approved:
      "I approve this control plan version: these routine tests, at these frequencies, keep the combination in its validated state.",
    performed: "I carried out the tests of this control plan as recorded.",
    verified: "I have checked this control plan version against its requirements.",
  },
  lab_method: {
    authored: "I am the author of this lab method version and submit it as written.",
    reviewed: "I have reviewed this lab method version and find it fit for approval.",
    approved:
      "I approve this lab method version for use: runs may cite it from now until a later version supersedes it.",
    performed: "I applied this lab method as written.",
    verified: "I have checked this lab method version against its qualification.",
  },
  training_record: {
    authored: "I recorded this training as it took place.",
    reviewed: "I have read and understood this version of the procedure and will work to it.",
    approved: "I approve this training record.",
    performed: "I took part in this training as recorded.",
    verified:
      "I have watched this person carry out the method and confirm they perform it correctly and unaided.",
  },
};

/** What a signature of this meaning on this kind of record affirms. */
export function meaningStatement(recordType: SignedRecordType, meaning: SignatureMeaning): string {
  return MEANING_STATEMENTS[recordType][meaning];
}
