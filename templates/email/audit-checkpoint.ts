import type { SignedCheckpoint } from "@/lib/audit/checkpoint";
import { renderEmail } from "./layout";

/**
 * The auditor's copy of a checkpoint. Kept by someone outside the company, it pins
 * the audit trail even if the server and its evidence store were both rewritten:
 * the JSON line below is exactly the stored checkpoint file.
 */
export function checkpointEmail(input: { checkpoint: SignedCheckpoint }) {
  const cp = input.checkpoint;
  return renderEmail({
    subject: `Audit trail checkpoint: event ${cp.seq}`,
    paragraphs: [
      `The audit trail held ${cp.seq} events at ${cp.at}. The last event's hash is ${cp.hash}.`,
      `This checkpoint is signed with the installation's Ed25519 key ${cp.keyId} (asked by: ${cp.by}). Please keep this message: if the trail is ever rewritten, comparing it with your copy shows where.`,
      `Checkpoint: ${JSON.stringify(cp)}`,
    ],
    link: { label: "Check the audit trail", path: "/trace/audit" },
  });
}
