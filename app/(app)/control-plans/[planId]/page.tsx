import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { getDb } from "@/db/client";
import { ControlPlanForm } from "@/components/control-plans/control-plan-form";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { ActionForm } from "@/components/ui/action-form";
import { Caution } from "@/components/ui/caution";
import { Field, TextareaField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import {
  CHARACTERISTIC_LABELS,
  CONTROL_PLAN_STATUS_LABELS,
  DUE_STATE_LABELS,
  frequencyWords,
  isBathCharacteristic,
  sampleWords,
} from "@/lib/control-plans/characteristics";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listDueControlPlanTests } from "@/lib/server/control-plans/due-tests";
import { dueTestHref } from "@/lib/server/control-plans/queue-provider";
import { loadControlPlan, type ControlPlanView } from "@/lib/server/control-plans/state";
import { UserFacingError } from "@/lib/server/errors";
import { signatureValidity } from "@/lib/signatures/rules";
import {
  approveControlPlanAction,
  returnControlPlanFromApprovalAction,
  returnControlPlanFromReviewAction,
  reviewControlPlanAction,
  reviseControlPlanAction,
  saveControlPlanDraftAction,
  signControlPlanAction,
} from "../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ planId: string }>;
}): Promise<Metadata> {
  return recordTitle("controlPlan", (await params).planId, "Control plan");
}

type Version = ControlPlanView["versions"][number];

function LinesTable({ version }: { version: Version }) {
  return (
    <Table density="compact" caption={`Lines of version ${version.version}`}>
      <THead>
        <Th>Characteristic</Th>
        <Th>Method</Th>
        <Th align="right">Sample</Th>
        <Th align="right">Distinct cycles</Th>
        <Th>Frequency</Th>
        <Th>Reaction plan</Th>
      </THead>
      <TBody>
        {version.lines.length === 0 && <EmptyRow colSpan={6}>No line yet.</EmptyRow>}
        {version.lines.map((l) => (
          <tr key={l.id}>
            <Td>
              {CHARACTERISTIC_LABELS[l.characteristic]}
              {l.tank ? <span className="block text-xs text-stone-600">on {l.tank}</span> : null}
            </Td>
            <Td>{l.method}</Td>
            <Td numeric>{sampleWords(l.characteristic, l.sampleSize)}</Td>
            <Td numeric>{l.minCycles === null ? "—" : `${l.minCycles} cycles`}</Td>
            <Td>{frequencyWords(l.frequency, l.everyN)}</Td>
            <Td className="whitespace-pre-line">{l.reactionPlan}</Td>
          </tr>
        ))}
      </TBody>
    </Table>
  );
}

export default async function ControlPlanPage({ params }: { params: Promise<{ planId: string }> }) {
  const user = await requirePageUser("control_plan.view");
  const { planId } = await params;
  const view = await loadControlPlan(getDb(), planId).catch((error) => {
    if (error instanceof UserFacingError && error.kind === "not_found") notFound();
    throw error;
  });
  const { combination: c } = view;
  const due = await listDueControlPlanTests({ controlPlanId: planId });
  const hasBathLines = view.versions.some((v) =>
    v.lines.some((l) => isBathCharacteristic(l.characteristic)),
  );
  const canDraft = can(user.roles, "control_plan.draft");
  return (
    <>
      <PageHeader
        title={`Control plan ${c.name}`}
        description={`Routine tests of ${c.family.code} ${c.family.name} washed on ${c.systemCode} with ${c.recipeCode} ${c.recipeName}, version ${c.version}.`}
      />
      <p className="mb-4 flex flex-wrap gap-4 text-sm">
        <IntentLink
          href={`/systems/recipes/${c.recipeId}/versions/${c.version}`}
          className="text-brand-800 underline"
        >
          Recipe {c.recipeCode} version {c.version}
        </IntentLink>
        <IntentLink href={`/parts/families/${c.family.id}`} className="text-brand-800 underline">
          Part family {c.family.code}
        </IntentLink>
      </p>
      {hasBathLines && (
        <div className="mb-6">
          <Caution title="hot and alkaline baths">
            Bath samples are taken from hot detergent solutions: wear the gloves, goggles and apron
            the detergent&apos;s safety data sheet names, use the sampling point, and never reach
            into a running tank.
          </Caution>
        </div>
      )}

      <section aria-labelledby="due" className="mb-8">
        <h2 id="due" className="mb-2 text-lg font-semibold">
          Routine tests now
        </h2>
        {view.effective ? (
          c.versionStatus === "effective" ? null : (
            <p className="mb-2 text-sm">
              Recipe version {c.version} is {c.versionStatus}: no tests are scheduled on it.
            </p>
          )
        ) : (
          <p className="mb-2 text-sm">No version is approved yet: nothing is scheduled.</p>
        )}
        <Table caption="Due state per line" density="compact">
          <THead>
            <Th>Characteristic</Th>
            <Th>Frequency</Th>
            <Th>Last satisfied</Th>
            <Th>Due from</Th>
            <Th>Overdue from</Th>
            <Th>State</Th>
            <Th>Record it</Th>
          </THead>
          <TBody>
            {due.length === 0 && <EmptyRow colSpan={7}>Nothing scheduled.</EmptyRow>}
            {due.map((t) => (
              <tr key={t.lineId}>
                <Td>
                  {CHARACTERISTIC_LABELS[t.characteristic]}
                  {t.tank ? (
                    <span className="block text-xs text-stone-600">on {t.tank}</span>
                  ) : null}
                </Td>
                <Td>{frequencyWords(t.frequency, t.everyN)}</Td>
                <Td>{formatDateTime(t.lastDoneAt, { fallback: "never recorded" })}</Td>
                <Td>{formatDateTime(t.dueAt, { fallback: "count not reached" })}</Td>
                <Td>{formatDateTime(t.overdueAt)}</Td>
                <Td className="font-semibold">{DUE_STATE_LABELS[t.state]}</Td>
                <Td>
                  {t.state !== "ok" &&
                  can(user.roles, t.testType ? "evidence.record" : "bath.record") ? (
                    <IntentLink href={dueTestHref(t)} className="text-brand-800 underline">
                      {t.testType ? "Open a run" : "Record a reading"}
                    </IntentLink>
                  ) : (
                    "—"
                  )}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
        <p className="mt-2 text-xs text-stone-600">
          A verified run of the line&apos;s test on this combination, or a reading of its value on
          its tank, satisfies a line. Timed lines follow the site&apos;s shifts and zone; a test is
          overdue one interval after it fell due.
        </p>
      </section>

      {canDraft && !view.open && (
        <section aria-labelledby="revise" className="mb-8">
          <h2 id="revise" className="mb-2 text-lg font-semibold">
            Revise
          </h2>
          <ActionForm
            action={reviseControlPlanAction}
            aria-label="Revise control plan"
            className="max-w-xl space-y-3"
          >
            <input type="hidden" name="planId" value={view.plan.id} />
            <Field
              name="note"
              label="Why the plan changes"
              hint="Opens the next version as a draft; the version in force stays until the new one is approved."
            />
            <SubmitButton variant="secondary">Open a new version</SubmitButton>
          </ActionForm>
        </section>
      )}

      {view.versions.map((v) => {
        const hidden = { versionId: v.id };
        const label = `${c.name} version ${v.version}`;
        const mine = v.signatures.filter((s) => s.userId === user.id);
        const signing = {
          signerName: user.name,
          recordLabel: label,
          contentHash: v.contentHash,
          hidden,
          recordType: "control_plan_version" as const,
        };
        return (
          <section
            key={v.id}
            aria-labelledby={`version-${v.version}`}
            className="mb-8 rounded-lg border border-stone-200 bg-white p-4"
          >
            <h2 id={`version-${v.version}`} className="text-lg font-semibold">
              Version {v.version}: {CONTROL_PLAN_STATUS_LABELS[v.status]}
            </h2>
            <p className="mb-3 text-sm text-stone-700">
              {v.note}. Drafted by {v.author} on {formatDate(v.createdAt)}
              {v.effectiveAt ? `; effective since ${formatDateTime(v.effectiveAt)}` : ""}
              {v.supersededAt ? `; superseded ${formatDateTime(v.supersededAt)}` : ""}.
            </p>
            {v.status === "draft" && canDraft ? (
              <ControlPlanForm
                action={saveControlPlanDraftAction}
                label={`Lines of draft version ${v.version}`}
                tanks={view.tanks.map((t) => ({ ...t, systemId: c.systemId }))}
                versionId={v.id}
                initialLines={v.lines.map((l) => ({
                  characteristic: l.characteristic,
                  method: l.method,
                  stageId: l.stageId ?? "",
                  sampleSize: String(l.sampleSize),
                  minCycles: l.minCycles === null ? "" : String(l.minCycles),
                  frequency: l.frequency,
                  everyN: l.everyN === null ? "" : String(l.everyN),
                  reactionPlan: l.reactionPlan,
                }))}
                submitLabel="Save draft"
              />
            ) : (
              <LinesTable version={v} />
            )}
            <h3 className="mt-4 mb-2 font-semibold">Signatures</h3>
            <SignatureList
              signatures={v.signatures.map((s) => ({
                ...s,
                validity: signatureValidity(s.contentHash, v.contentHash),
              }))}
            />
            <p className="mt-2 font-mono text-xs break-all text-stone-500">
              Content hash {v.contentHash}
            </p>
            <div className="mt-3 flex flex-wrap gap-3">
              {v.status === "draft" && v.createdBy === user.id && canDraft && (
                <SignatureDialog
                  {...signing}
                  action={signControlPlanAction}
                  meaning="authored"
                  buttonLabel="Sign and send for review"
                />
              )}
              {v.status === "in_review" &&
                can(user.roles, "control_plan.review") &&
                mine.length === 0 && (
                  <SignatureDialog
                    {...signing}
                    action={reviewControlPlanAction}
                    meaning="reviewed"
                    buttonLabel="Sign as reviewed"
                  />
                )}
              {v.status === "reviewed" &&
                can(user.roles, "control_plan.approve") &&
                mine.length === 0 && (
                  <SignatureDialog
                    {...signing}
                    action={approveControlPlanAction}
                    meaning="approved"
                    buttonLabel="Approve control plan"
                  />
                )}
            </div>
            {((v.status === "in_review" && can(user.roles, "control_plan.review")) ||
              (v.status === "reviewed" && can(user.roles, "control_plan.approve"))) && (
              <ActionForm
                action={
                  v.status === "in_review"
                    ? returnControlPlanFromReviewAction
                    : returnControlPlanFromApprovalAction
                }
                aria-label={`Send version ${v.version} back`}
                className="mt-4 max-w-xl space-y-3"
              >
                <input type="hidden" name="versionId" value={v.id} />
                <TextareaField name="reason" label="What must change" rows={2} />
                <SubmitButton variant="secondary">Send back to the author</SubmitButton>
              </ActionForm>
            )}
          </section>
        );
      })}
    </>
  );
}
