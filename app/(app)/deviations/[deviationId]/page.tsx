import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { getDb } from "@/db/client";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { ActionForm } from "@/components/ui/action-form";
import { Field, TextareaField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { DEVIATION_STATE_LABELS, RISK_LABELS, stepProblem } from "@/lib/deviations/rules";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { rangeWithUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { loadDeviation } from "@/lib/server/deviations/state";
import { UserFacingError } from "@/lib/server/errors";
import { signatureValidity } from "@/lib/signatures/rules";
import {
  approveDeviationAction,
  recordDeviationLotAction,
  signDeviationAction,
  withdrawDeviationAction,
} from "../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ deviationId: string }>;
}): Promise<Metadata> {
  return recordTitle("deviation", (await params).deviationId, "Deviation");
}

const EXPIRY_WORDS = { end_date: "its last day has passed", lots_used: "its lots are used up" };

export default async function DeviationPage({
  params,
}: {
  params: Promise<{ deviationId: string }>;
}) {
  const user = await requirePageUser("deviation.view");
  const { deviationId } = await params;
  const view = await loadDeviation(getDb(), deviationId).catch((error) => {
    if (error instanceof UserFacingError && error.kind === "not_found") notFound();
    throw error;
  });
  const { deviation: d, state } = view;
  const authored = view.signatures.find(
    (s) => s.meaning === "authored" && s.contentHash === view.contentHash,
  );
  const canSign =
    state === "draft" && !authored && d.createdBy === user.id && can(user.roles, "deviation.draft");
  const canApprove =
    state === "draft" &&
    authored !== undefined &&
    authored.userId !== user.id &&
    can(user.roles, "deviation.approve");
  const hidden = { deviationId: d.id };
  return (
    <>
      <PageHeader
        title={`${d.number} ${d.title}`}
        description={`Temporary deviation on ${view.recipe.code} · ${view.recipe.name}, drafted by ${view.author} on ${formatDate(d.createdAt)}.`}
      />
      <p className="mb-4 text-sm">
        State: <span className="font-semibold">{DEVIATION_STATE_LABELS[state]}</span>
        {state === "expired" && view.expiry ? ` — ${EXPIRY_WORDS[view.expiry]}` : ""}
        {state === "active" ? " — production may run within the temporary values below." : ""}
        {state === "draft" && !authored ? " — waiting for its author's signature." : ""}
        {state === "draft" && authored ? " — signed by its author, waiting for approval." : ""}
      </p>

      <section aria-labelledby="scope" className="mb-6">
        <h2 id="scope" className="mb-2 text-lg font-semibold">
          Scope and limits
        </h2>
        <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
          <dt className="text-stone-600">Recipe</dt>
          <dd>
            <IntentLink
              href={`/systems/recipes/${view.recipe.id}`}
              className="text-brand-800 underline"
            >
              {view.recipe.code}
            </IntentLink>{" "}
            {view.recipe.name}
          </dd>
          <dt className="text-stone-600">Part families</dt>
          <dd>{view.families.map((f) => `${f.code} ${f.name}`).join("; ")}</dd>
          <dt className="text-stone-600">Last day</dt>
          <dd>{formatDate(d.endsOn, "no end date")}</dd>
          <dt className="text-stone-600">Lots</dt>
          <dd>
            {view.lotsUsed} used{d.maxLots !== null ? ` of ${d.maxLots}` : ", no lot limit"}
          </dd>
          <dt className="text-stone-600">Reminder</dt>
          <dd>
            {d.reminderDays} days before the last day
            {d.remindedForEnd ? ` (sent for ${formatDate(d.remindedForEnd)})` : ""}
          </dd>
          <dt className="text-stone-600">Risk</dt>
          <dd>
            <span className="font-semibold">{RISK_LABELS[d.riskLevel]}</span>: {d.risk}
          </dd>
          <dt className="text-stone-600">Justification</dt>
          <dd className="whitespace-pre-line">{d.justification}</dd>
          {d.approvedAt && (
            <>
              <dt className="text-stone-600">Approved</dt>
              <dd>{formatDateTime(d.approvedAt)}</dd>
            </>
          )}
          {d.endedAt && (
            <>
              <dt className="text-stone-600">Ended</dt>
              <dd>{formatDateTime(d.endedAt)}</dd>
            </>
          )}
        </dl>
      </section>

      <Table caption="Temporary values" captionVisible frameClassName="mb-6">
        <THead>
          <Th>Parameter</Th>
          <Th>Validated range</Th>
          <Th>Temporary range</Th>
          <Th>Trace</Th>
        </THead>
        <TBody>
          {view.parameters.map((p) => (
            <tr key={p.id}>
              <Td>
                {p.name} <span className="font-mono text-xs text-stone-600">{p.key}</span>
              </Td>
              <Td>{rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}</Td>
              <Td className="font-semibold">
                {rangeWithUnit(p.temporaryLow, p.temporaryHigh, p.unit)}
              </Td>
              <Td>
                <IntentLink
                  href={`/trace?recipe=${view.recipe.id}&key=${encodeURIComponent(p.key)}`}
                  className="text-brand-800 underline"
                >
                  Trace of {p.key}
                </IntentLink>
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>

      <section aria-labelledby="signatures" className="mb-6">
        <h2 id="signatures" className="mb-2 text-lg font-semibold">
          Signatures
        </h2>
        <SignatureList
          signatures={view.signatures.map((s) => ({
            ...s,
            validity: signatureValidity(s.contentHash, view.contentHash),
          }))}
        />
        <p className="mt-2 font-mono text-xs break-all text-stone-500">
          Content hash {view.contentHash}
        </p>
        <div className="mt-3 flex flex-wrap gap-3">
          {canSign && (
            <SignatureDialog
              action={signDeviationAction}
              meaning="authored"
              recordType="deviation"
              signerName={user.name}
              recordLabel={d.number}
              contentHash={view.contentHash}
              hidden={hidden}
              buttonLabel="Sign and submit for approval"
            />
          )}
          {canApprove && (
            <SignatureDialog
              action={approveDeviationAction}
              meaning="approved"
              recordType="deviation"
              signerName={user.name}
              recordLabel={d.number}
              contentHash={view.contentHash}
              hidden={hidden}
              buttonLabel="Approve deviation"
            />
          )}
        </div>
      </section>

      <section aria-labelledby="lots" className="mb-6">
        <h2 id="lots" className="mb-2 text-lg font-semibold">
          Lots run under this deviation
        </h2>
        <Table density="compact" caption="Lots under this deviation">
          <THead>
            <Th>Lot</Th>
            <Th>Recorded by</Th>
            <Th>Recorded</Th>
          </THead>
          <TBody>
            {view.lots.length === 0 && <EmptyRow colSpan={3}>No lot recorded yet.</EmptyRow>}
            {view.lots.map((l) => (
              <tr key={l.lot}>
                <Td>{l.lot}</Td>
                <Td>{l.by}</Td>
                <Td>{formatDateTime(l.recordedAt)}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
        {stepProblem("record_lot", state) === null && can(user.roles, "deviation.record_lot") && (
          <ActionForm
            action={recordDeviationLotAction}
            aria-label="Record a lot"
            resetOnSuccess
            className="mt-3 flex flex-wrap items-end gap-3"
          >
            <input type="hidden" name="deviationId" value={d.id} />
            <Field name="lot" label="Lot number" />
            <SubmitButton>Count this lot</SubmitButton>
          </ActionForm>
        )}
      </section>

      {stepProblem("withdraw", state) === null && can(user.roles, "deviation.withdraw") && (
        <section aria-labelledby="withdraw" className="mb-6">
          <h2 id="withdraw" className="mb-2 text-lg font-semibold">
            Withdraw
          </h2>
          <ActionForm
            action={withdrawDeviationAction}
            aria-label="Withdraw deviation"
            className="max-w-xl space-y-3"
          >
            <input type="hidden" name="deviationId" value={d.id} />
            <TextareaField
              name="reason"
              label="Reason"
              hint="Ends it now: production returns to the validated values."
            />
            <SubmitButton variant="secondary">Withdraw</SubmitButton>
          </ActionForm>
        </section>
      )}
    </>
  );
}
