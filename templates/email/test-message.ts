import { renderEmail } from "./layout";

export function testMessageEmail(input: { requestedBy: string }) {
  return renderEmail({
    subject: "Test message",
    paragraphs: [
      `${input.requestedBy} sent this message from Admin › E-mail to check that Washproof can deliver e-mail.`,
    ],
    link: { label: "Open Washproof", path: "/" },
  });
}
