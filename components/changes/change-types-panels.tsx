import { ActionForm } from "@/components/ui/action-form";
import { Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import type { FormState } from "@/lib/actions/result";
import type { AffectedDocument } from "@/lib/changes/affected-documents";
import type { EmergencyApprovalState } from "@/lib/changes/emergency";
import type { EffectivenessResult } from "@/lib/changes/effectiveness";
import { formatDate, formatDateTime } from "@/lib/format/date";
import type { CustomerApprovalResult } from "@/lib/changes/customer-approval";
import { CustomerLetterUpload } from "./customer-letter-upload";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

/** The word itself, so it reads the same on screen, in print and to a screen reader. */
export function EmergencyBadge() {
  return (
    <span className="ml-2 rounded bg-red-700 px-2 py-0.5 text-xs font-semibold tracking-wide text-white uppercase">
      Emergency
    </span>
  );
}

const APPROVAL_WORDS: Record<EmergencyApprovalState, string> = {
  awaiting: "awaiting approval",
  overdue: "approval overdue",
  approved: "approved",
  ended: "ended: the previous version is back in force",
};

export function EmergencyPanel({
  emergency,
  approval,
}: {
  emergency: {
    justification: string;
    implementedAt: string;
    implementedByName: string;
    approvalDueOn: string;
    escalatedAt: string | null;
  };
  approval: EmergencyApprovalState;
}) {
  return (
    <section
      aria-labelledby="emergency"
      className="mb-8 rounded-lg border border-red-300 bg-red-50 p-5"
    >
      <h2 id="emergency" className="text-base font-semibold text-red-900">
        Emergency change: {APPROVAL_WORDS[approval]}
      </h2>
      <p className="mt-2 text-sm">
        Implemented before approval by {emergency.implementedByName} on{" "}
        {formatDateTime(emergency.implementedAt)}; the proposed version is in force. Approval due by{" "}
        <span className="font-semibold">{emergency.approvalDueOn}</span>
        {emergency.escalatedAt
          ? `; escalated to approvers and administrators on ${formatDate(emergency.escalatedAt)}`
          : ""}
        . Requalification evidence follows after approval, as for any change.
      </p>
      <p className="mt-2 text-sm">
        <span className="font-medium">Why it could not wait:</span> {emergency.justification}
      </p>
    </section>
  );
}

/** The fields the emergency signature asks for besides the password. */
export function EmergencyFields({ latestDue, days }: { latestDue: string; days: number }) {
  return (
    <>
      <p className="text-sm text-red-900">
        The proposed version takes force as soon as you sign, before any approval. An approver must
        sign within {days} day{days === 1 ? "" : "s"}.
      </p>
      <Field name="justification" label="Why this cannot wait for approval" />
      <Field
        name="approvalDueOn"
        label="Approval due by"
        type="date"
        defaultValue={latestDue}
        hint={`Today or later, at most ${latestDue}.`}
      />
    </>
  );
}

function documentState(d: AffectedDocument) {
  if (d.revisedBy)
    return `Revised: version ${d.revisedBy.version} effective ${formatDate(d.revisedBy.effectiveDate)}`;
  if (d.unaffectedReason) return `Confirmed unaffected: ${d.unaffectedReason}`;
  return "Open: revise it or confirm it unaffected";
}

export function AffectedDocumentsPanel({
  changeRequestId,
  affected,
  register,
  missing,
  editable,
  addAction,
  unaffectedAction,
}: {
  changeRequestId: string;
  affected: (AffectedDocument & { documentId: string })[];
  register: { id: string; number: string; title: string }[];
  missing: string[];
  editable: boolean;
  addAction: Action;
  unaffectedAction: Action;
}) {
  return (
    <section aria-labelledby="affected-documents" className="mb-8">
      <h2 id="affected-documents" className="mb-1 text-lg font-semibold">
        Affected documents
      </h2>
      <p className="mb-2 text-sm text-stone-600">
        Protocols, work instructions, the control plan and the process risk analysis this change
        touches. Before closure each is revised through the document workflow (a newer version
        effective since the change was opened) or confirmed unaffected with a reason.
      </p>
      <Table caption="Affected documents">
        <THead>
          <Th>Document</Th>
          <Th>Title</Th>
          <Th>State</Th>
          {editable && <Th>Confirm unaffected</Th>}
        </THead>
        <TBody>
          {affected.length === 0 && (
            <EmptyRow colSpan={editable ? 4 : 3}>No document listed.</EmptyRow>
          )}
          {affected.map((d) => (
            <tr key={d.documentId}>
              <Td>{d.number}</Td>
              <Td>{d.title}</Td>
              <Td>{documentState(d)}</Td>
              {editable && (
                <Td>
                  {!d.revisedBy && !d.unaffectedReason && (
                    <ActionForm
                      action={unaffectedAction}
                      aria-label={`Confirm ${d.number} unaffected`}
                      className="flex items-end gap-2"
                    >
                      <input type="hidden" name="changeRequestId" value={changeRequestId} />
                      <input type="hidden" name="documentId" value={d.documentId} />
                      <Field name="reason" label={`Why ${d.number} is not affected`} dense />
                      <SubmitButton variant="secondary">Confirm unaffected</SubmitButton>
                    </ActionForm>
                  )}
                </Td>
              )}
            </tr>
          ))}
        </TBody>
      </Table>
      {missing.length > 0 && (
        <p className="mt-2 text-sm text-stone-700">
          Closure waits for {missing.length} document{missing.length > 1 ? "s" : ""}.
        </p>
      )}
      {editable && register.length > 0 && (
        <ActionForm
          action={addAction}
          aria-label="List an affected document"
          className="mt-3 flex items-end gap-2"
        >
          <input type="hidden" name="changeRequestId" value={changeRequestId} />
          <SelectField
            name="documentId"
            label="Document from the register"
            placeholder="Choose…"
            options={register.map((d) => ({ value: d.id, label: `${d.number} · ${d.title}` }))}
          />
          <SubmitButton variant="secondary">List document</SubmitButton>
        </ActionForm>
      )}
    </section>
  );
}

export function EffectivenessPanel({ result }: { result: EffectivenessResult }) {
  const heading =
    result.state === "pending"
      ? `pending (${result.passed} of ${result.required})`
      : result.state === "confirmed"
        ? "confirmed"
        : "failed";
  return (
    <section
      aria-labelledby="effectiveness"
      className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
    >
      <h2 id="effectiveness" className="text-base font-semibold">
        Effectiveness check: {heading}
      </h2>
      <p className="mt-2 text-sm">
        The first {result.required} runs verified on the new version after closure must pass.
        {result.counted.length > 0
          ? ` Counted: ${result.counted.join(", ")}.`
          : " None verified yet."}
        {result.failedRun ? ` ${result.failedRun} did not pass.` : ""}
      </p>
    </section>
  );
}

export function CustomerApprovalPanel({
  changeRequestId,
  result,
  editable,
  today,
  action,
}: {
  changeRequestId: string;
  result: CustomerApprovalResult;
  editable: boolean;
  today: string;
  action: Action;
}) {
  return (
    <section
      aria-labelledby="customer-approval"
      className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
    >
      <h2 id="customer-approval" className="text-base font-semibold">
        Customer approval: {result.holds ? "given" : "required"}
      </h2>
      <p className="mt-1 text-sm text-stone-600">
        A major change to a process whose specification says the customer must approve process
        changes takes force only with the customer&apos;s recorded approval.
      </p>
      <ul className="mt-3 space-y-4 text-sm">
        {result.specs.map(({ spec, decision }) => (
          <li key={spec.id} className="rounded-md border border-stone-200 p-3">
            <p>
              <span className="font-medium">{spec.label}</span>:{" "}
              {decision
                ? `${decision.decision === "approved" ? "approved" : "rejected"} by the customer on ${decision.decidedOn} (${decision.reference})`
                : "no decision recorded"}
            </p>
            {decision?.decision === "rejected" && (
              <p className="mt-1 font-medium text-red-800">
                The customer rejected this change: the new version cannot take force. Rework the
                change and record the customer&apos;s new decision, or withdraw it.
              </p>
            )}
            {editable && (
              <ActionForm
                action={action}
                aria-label={`Customer decision for ${spec.label}`}
                className="mt-3 grid gap-3 sm:grid-cols-2"
              >
                <input type="hidden" name="changeRequestId" value={changeRequestId} />
                <input type="hidden" name="specId" value={spec.id} />
                <SelectField
                  name="decision"
                  label="Customer's decision"
                  placeholder="Choose…"
                  options={[
                    { value: "approved", label: "Approved" },
                    { value: "rejected", label: "Rejected" },
                  ]}
                />
                <Field name="decidedOn" label="Decided on" type="date" defaultValue={today} />
                <Field name="reference" label="Customer's reference" />
                <CustomerLetterUpload label="Customer's letter" />
                <div className="sm:col-span-2">
                  <SubmitButton variant="secondary">
                    Record the customer&apos;s decision
                  </SubmitButton>
                </div>
              </ActionForm>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
