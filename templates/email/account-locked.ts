import { renderEmail } from "./layout";

/** To administrators when an account locks: a lock can be an attack in progress, or a colleague stuck. */
export function accountLockedEmail(input: {
  name: string;
  email: string;
  lockedUntil: string;
  attempts: number;
  during: "sign_in" | "signing";
  sourceAddress: string | null;
  userId: string;
}) {
  const where = input.during === "signing" ? "while signing a record" : "at sign-in";
  return renderEmail({
    subject: `Account locked: ${input.name}`,
    paragraphs: [
      `The account of ${input.name} (${input.email}) locked after ${input.attempts} wrong passwords ${where}${input.sourceAddress ? `, the last from address ${input.sourceAddress}` : ""}.`,
      `It unlocks by itself at ${input.lockedUntil.slice(0, 16).replace("T", " ")} UTC. If ${input.name} did not make these attempts, someone may be guessing the password: check the audit trail, and reset the password from the user's page.`,
    ],
    link: { label: "Open the user", path: `/admin/users/${input.userId}` },
  });
}
