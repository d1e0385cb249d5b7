export interface CustomerSpec {
  id: string;
  /** How the page and the refusal name it, e.g. "VDA-VB-01 rev 3 (Norrland Hydraulics)". */
  label: string;
  customerApprovesChanges: boolean;
}

export interface CustomerDecision {
  specId: string;
  decision: "approved" | "rejected";
  decidedOn: string;
  reference: string;
  recordedAt: string;
}

export interface CustomerApprovalResult {
  /** False when no specification touched by a major change asks for the customer's approval. */
  required: boolean;
  holds: boolean;
  /** One plain line per specification still waiting or refused. */
  missing: string[];
  /** Per specification asking for approval: the decision that counts (the latest), or null. */
  specs: { spec: CustomerSpec; decision: CustomerDecision | null }[];
}

/**
 * The customer-approval gate (issue #13 item 4): a MAJOR change to a process whose part family's
 * specification says the customer must approve process changes needs the customer's recorded
 * approval for each such specification before the new version becomes effective. The latest
 * decision counts; a rejection blocks. Editorial and minor changes are not process changes
 * the customer asked to approve.
 */
export function evaluateCustomerApproval(
  impact: "editorial" | "minor" | "major",
  specs: readonly CustomerSpec[],
  decisions: readonly CustomerDecision[],
): CustomerApprovalResult {
  const asking = impact === "major" ? specs.filter((s) => s.customerApprovesChanges) : [];
  const rows = asking.map((spec) => {
    const latest =
      decisions
        .filter((d) => d.specId === spec.id)
        .sort((a, b) => b.recordedAt.localeCompare(a.recordedAt))[0] ?? null;
    return { spec, decision: latest };
  });
  const missing = rows.flatMap(({ spec, decision }) => {
    if (!decision) return [`${spec.label}: the customer's decision is not recorded`];
    if (decision.decision === "rejected")
      return [
        `${spec.label}: the customer rejected this change on ${decision.decidedOn} (${decision.reference})`,
      ];
    return [];
  });
  return { required: rows.length > 0, holds: missing.length === 0, missing, specs: rows };
}
