import type { Metadata } from "next";
import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { readMailbox } from "@/lib/email/mailbox";
import { env } from "@/lib/env";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listOutbox } from "@/lib/server/email/queries";
import { sendTestEmailAction } from "../actions";
import { formatDateTime } from "@/lib/format/date";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Admin · E-mail" };

const STATUS_WORDS = { pending: "Queued", sent: "Sent", failed: "Failed — gave up" } as const;

export default async function EmailAdminPage() {
  const user = await requirePageUser("users.manage");
  const outbox = await listOutbox();
  const demo = env().DEMO_MODE;
  const mailbox = demo ? readMailbox() : [];
  return (
    <>
      <PageHeader
        title="E-mail"
        description="Notifications are queued with the step that causes them and sent after it is saved; failed sends are retried with growing delays, then shown here as failed."
      />
      <section aria-labelledby="test-mail" className="mb-8 max-w-md">
        <h2 id="test-mail" className="mb-2 font-semibold">
          Send a test message
        </h2>
        <ActionForm
          action={sendTestEmailAction}
          className="flex items-end gap-2"
          aria-label="Send a test message"
        >
          <Field name="to" label="To" type="email" defaultValue={user.email} className="flex-1" />
          <SubmitButton variant="secondary">Send</SubmitButton>
        </ActionForm>
      </section>

      <section aria-labelledby="outbox" className="mb-10">
        <h2 id="outbox" className="mb-2 font-semibold">
          Outbox
        </h2>
        <Table>
          <THead>
            <Th>Queued (UTC)</Th>
            <Th>To</Th>
            <Th>Subject</Th>
            <Th>Status</Th>
            <Th align="right">Attempts</Th>
            <Th>Last error</Th>
          </THead>
          <TBody>
            {outbox.length === 0 && <EmptyRow colSpan={6}>No e-mail has been queued yet.</EmptyRow>}
            {outbox.map((m) => (
              <tr key={m.id}>
                <Td className="tabular-nums">
                  {formatDateTime(m.createdAt, { seconds: true, zone: false })}
                </Td>
                <Td>{m.to}</Td>
                <Td>{m.subject}</Td>
                <Td className={m.status === "failed" ? "font-medium text-red-800" : ""}>
                  {STATUS_WORDS[m.status]}
                </Td>
                <Td numeric>{m.attempts}</Td>
                <Td className="text-xs text-stone-600">{m.lastError ?? "—"}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
      </section>

      {demo && (
        <section aria-labelledby="mailbox">
          <h2 id="mailbox" className="mb-1 font-semibold">
            Demo mailbox
          </h2>
          <p className="mb-3 text-sm text-stone-600">
            In demo mode e-mail goes to a capturing server on this machine instead of real inboxes.
            Everything it received:
          </p>
          {mailbox.length === 0 ? (
            <p className="text-sm text-stone-600">The demo mailbox is empty.</p>
          ) : (
            <ul className="space-y-3">
              {mailbox.map((m) => (
                <li key={m.id}>
                  <details className="rounded-lg border border-stone-200 bg-white p-3">
                    <summary className="cursor-pointer text-sm">
                      <span className="font-medium">{m.subject}</span>{" "}
                      <span className="text-stone-600">
                        to {m.to.join(", ")} · {formatDateTime(m.receivedAt, { seconds: true })}
                      </span>
                    </summary>
                    <pre className="mt-2 font-sans text-sm whitespace-pre-wrap text-stone-800">
                      {m.text}
                    </pre>
                  </details>
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </>
  );
}
