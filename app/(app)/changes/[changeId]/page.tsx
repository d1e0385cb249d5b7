import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { DiffView, ImpactWorking } from "@/components/changes/diff-view";
import { ProposalEditor } from "@/components/changes/proposal-editor";
import { SubjectView } from "@/components/changes/subject-view";
import { DocumentEditorLoader } from "@/components/documents/document-editor-loader";
import { LinkEvidenceForm, ReasonStep, StepButton } from "@/components/changes/step-forms";
import { RecipeTable } from "@/components/recipes/recipe-table";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import {
  CHANGE_KIND_LABELS,
  CHANGE_STEPS,
  CHANGE_STATUS_LABELS,
  stepOffered,
  waitingFor,
  type ChangeStep,
} from "@/lib/changes/workflow";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { ChangeNonconformances } from "@/components/nonconformances/change-nonconformances";
import { getChangeRequestHeading, getChangeRequestPage } from "@/lib/server/changes/queries";
import { UserFacingError } from "@/lib/server/errors";
import { EmptyState } from "@/components/ui/empty-state";
import { renderRichHtml } from "@/lib/documents/render-html";
import type { RichDoc } from "@/lib/documents/rich-text";
import {
  approveChangeAction,
  assessChangeAction,
  closeChangeAction,
  linkEvidenceAction,
  rejectChangeAction,
  reopenChangeAction,
  saveProposalAction,
  startRequalificationAction,
  verifyChangeAction,
  withdrawChangeAction,
  implementEmergencyAction,
  addAffectedDocumentAction,
  confirmUnaffectedAction,
  recordCustomerDecisionAction,
} from "../actions";
import {
  AffectedDocumentsPanel,
  CustomerApprovalPanel,
  EffectivenessPanel,
  EmergencyBadge,
  EmergencyFields,
  EmergencyPanel,
} from "@/components/changes/change-types-panels";
import { showsEmergency } from "@/lib/changes/emergency";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { getChangeTypesPanel } from "@/lib/server/changes/change-types-page";
import { formatDate } from "@/lib/format/date";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ changeId: string }>;
}): Promise<Metadata> {
  return recordTitle("change", (await params).changeId, "Change request");
}

export default async function ChangePage({ params }: { params: Promise<{ changeId: string }> }) {
  const user = await requirePageUser("changes.view");
  const { changeId } = await params;
  if (!/^[0-9a-f-]{36}$/.test(changeId)) notFound();
  const loaded = await getChangeRequestPage(changeId).then(
    (page) => ({ page, refusal: null }),
    (error: unknown) => {
      // Only a missing change is "not found"; a change that exists but cannot be shown says why,
      // and anything unexpected reaches the error page rather than hiding as a 404.
      if (!(error instanceof UserFacingError)) throw error;
      if (error.kind === "not_found") notFound();
      return { page: null, refusal: error.message };
    },
  );
  if (!loaded.page) return <UnshownChange changeId={changeId} reason={loaded.refusal} />;
  const page = loaded.page;
  const {
    cr,
    recipe,
    fromVersion,
    toVersion,
    assessment,
    impact,
    requirements,
    gate,
    linked,
    candidates,
  } = page;
  const types = await getChangeTypesPanel(page);
  const emergencyShown = types.emergency !== null && showsEmergency(cr.status);
  const may = (step: ChangeStep) =>
    can(user.roles, CHANGE_STEPS[step].permission) &&
    stepOffered(step, cr.status, requirements.length, gate.holds);
  const waiting = waitingFor(cr.status, requirements.length, gate);
  // The engineer's next step during requalification is entering the evidence each open requirement lacks.
  const evidenceToEnter =
    cr.status === "requalification" && can(user.roles, "evidence.record")
      ? gate.requirements.filter((r) => r.satisfiedBy === null).map((r) => r.requirement)
      : [];
  const hidden = { changeRequestId: cr.id };
  const label = `${cr.number} revision ${page.assessmentRow.revision}`;
  const editing = cr.status === "draft" && can(user.roles, "recipe.edit");
  const narrative = page.narrative;
  const editNarrative =
    editing && narrative?.status === "draft" && can(user.roles, "document.draft");
  const gateMatters =
    ["approved_for_implementation", "requalification", "verified"].includes(cr.status) &&
    requirements.length > 0;

  return (
    <>
      <PageHeader
        title={`${cr.number} · ${cr.title}`}
        description={
          <>
            {emergencyShown && (
              <>
                <EmergencyBadge />{" "}
              </>
            )}
            Status: <span className="font-semibold">{CHANGE_STATUS_LABELS[cr.status]}</span> ·{" "}
            {CHANGE_KIND_LABELS[page.assessmentRow.kind]} ·{" "}
            <IntentLink
              href={`/systems/recipes/${recipe.id}`}
              className="text-brand-800 hover:underline"
            >
              {recipe.code}
            </IntentLink>{" "}
            {fromVersion
              ? `version ${fromVersion.version} → proposed version ${toVersion.version}`
              : `first version ${toVersion.version}`}
            {page.family
              ? fromVersion
                ? ` · adds ${page.family.code}`
                : ` · validated for ${page.family.code}`
              : ""}{" "}
            · opened by {page.author} on {formatDate(cr.createdAt)}
          </>
        }
      />
      <ChangeNonconformances changeRequestId={cr.id} />

      <section
        aria-labelledby="next"
        className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
      >
        <h2 id="next" className="mb-3 text-base font-semibold">
          Next step
        </h2>
        <div className="flex flex-wrap items-start gap-3">
          {may("assess") && (
            <SignatureDialog
              action={assessChangeAction}
              recordType="change_request"
              meaning="authored"
              signerName={user.name}
              recordLabel={label}
              contentHash={page.contentHash}
              hidden={hidden}
              buttonLabel="Sign and submit impact assessment"
            />
          )}
          {cr.status === "impact_assessed" &&
            !types.emergency &&
            page.assessmentRow.kind !== "initial_validation" &&
            can(user.roles, "change.draft") && (
              <SignatureDialog
                action={implementEmergencyAction}
                recordType="change_request"
                meaning="authored"
                signerName={user.name}
                recordLabel={label}
                contentHash={page.contentHash}
                hidden={hidden}
                buttonLabel="Implement now as emergency change"
              >
                <EmergencyFields
                  latestDue={types.latestDue}
                  days={types.settings.emergencyApprovalDays}
                />
              </SignatureDialog>
            )}
          {may("approve") && (
            <SignatureDialog
              action={approveChangeAction}
              recordType="change_request"
              meaning="approved"
              signerName={user.name}
              recordLabel={label}
              contentHash={page.contentHash}
              hidden={hidden}
              buttonLabel="Approve for implementation"
            />
          )}
          {may("start_requalification") && (
            <StepButton
              action={startRequalificationAction}
              changeRequestId={cr.id}
              label="Start requalification"
            />
          )}
          {may("verify") && (
            <SignatureDialog
              action={verifyChangeAction}
              recordType="change_request"
              meaning="verified"
              signerName={user.name}
              recordLabel={label}
              contentHash={page.contentHash}
              hidden={hidden}
              buttonLabel="Verify change"
            />
          )}
          {may("close") && (
            <StepButton
              action={closeChangeAction}
              changeRequestId={cr.id}
              label="Close and make effective"
            />
          )}
          {may("reopen") && (
            <ReasonStep
              action={reopenChangeAction}
              changeRequestId={cr.id}
              label="Reopen for editing"
              variant="secondary"
            />
          )}
          {may("reject") && (
            <ReasonStep action={rejectChangeAction} changeRequestId={cr.id} label="Reject" />
          )}
          {may("withdraw") && (
            <ReasonStep action={withdrawChangeAction} changeRequestId={cr.id} label="Withdraw" />
          )}
        </div>
        {waiting && (
          <div className="mt-3 text-sm" role="note" aria-label="What the next step waits for">
            <p>{waiting.summary}</p>
            {waiting.missing.length > 0 && (
              <ul className="mt-1 list-disc pl-5">
                {waiting.missing.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            )}
          </div>
        )}
        {evidenceToEnter.length > 0 && (
          <ul className="mt-3 flex flex-wrap gap-3 text-sm" aria-label="Enter the evidence">
            {evidenceToEnter.map((r) => {
              const query = new URLSearchParams({
                change: cr.id,
                testType: r.testType,
                samples: String(r.samples),
              });
              return (
                <li key={r.id}>
                  <IntentLink
                    href={`/evidence/runs/new?${query}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    Open a {TEST_TYPE_LABELS[r.testType].toLowerCase()} run for {cr.number}
                  </IntentLink>
                </li>
              );
            })}
          </ul>
        )}
        {cr.status === "closed" && (
          <p className="mt-2 text-sm">
            Closed on {formatDate(cr.closedAt)}: version {toVersion.version} is effective.
          </p>
        )}
        {(cr.status === "rejected" || cr.status === "withdrawn") && (
          <p className="mt-2 text-sm">
            {CHANGE_STATUS_LABELS[cr.status]} on {formatDate(cr.closedAt)}; proposed version{" "}
            {toVersion.version} was withdrawn
            {types.emergency ? "; the version it replaced is back in force" : ""}.
          </p>
        )}
      </section>

      {types.emergency && types.approval && (
        <EmergencyPanel emergency={types.emergency} approval={types.approval} />
      )}

      {types.effectiveness && <EffectivenessPanel result={types.effectiveness} />}

      {types.customer.required && (
        <CustomerApprovalPanel
          changeRequestId={cr.id}
          result={types.customer}
          editable={OPEN_STATUSES.includes(cr.status) && can(user.roles, "change.draft")}
          today={types.today}
          action={recordCustomerDecisionAction}
        />
      )}

      {gateMatters && (
        <section
          aria-labelledby="gate"
          className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
        >
          <h2 id="gate" className="text-base font-semibold">
            Requalification gate: {gate.holds ? "met" : "not met"}
          </h2>
          {!gate.holds && (
            <div className="mt-2 text-sm">
              <p className="font-medium">Missing before the change can be verified and closed:</p>
              <ul className="mt-1 list-disc pl-5" aria-label="What is missing">
                {gate.missing.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            </div>
          )}
          <ul className="mt-4 space-y-3 text-sm">
            {gate.requirements.map(({ requirement, satisfiedBy }) => {
              const label = TEST_TYPE_LABELS[requirement.testType];
              const runs = linked.get(requirement.id) ?? [];
              const offer = candidates.filter(
                (c) => c.testType === requirement.testType && !runs.some((r) => r.id === c.id),
              );
              return (
                <li key={requirement.id} className="rounded-md border border-stone-200 p-3">
                  <p>
                    <span className="font-medium">{label}</span> on {requirement.samples} parts
                    {requirement.cycles ? ` from at least ${requirement.cycles} cycles` : ""}:{" "}
                    {satisfiedBy ? `met by ${satisfiedBy}` : "not met"}
                  </p>
                  {runs.length > 0 && (
                    <p className="text-stone-700">
                      Linked:{" "}
                      {runs
                        .map(
                          (r) =>
                            `${r.number} (${r.status}, outcome ${r.outcome ?? "not computed"}, ${r.sampleCount} samples)`,
                        )
                        .join("; ")}
                    </p>
                  )}
                  {cr.status === "requalification" &&
                    can(user.roles, "evidence.record") &&
                    offer.length > 0 && (
                      <LinkEvidenceForm
                        action={linkEvidenceAction}
                        changeRequestId={cr.id}
                        requirementId={requirement.id}
                        label={label}
                        runs={offer}
                      />
                    )}
                </li>
              );
            })}
          </ul>
          <p className="mt-3 text-xs text-stone-600">
            Runs count when they are on proposed version {toVersion.version}, their computed outcome
            passes, they hold at least the required samples and a second person verified them. A
            computed pass supports, and never replaces, the customer&apos;s specification and the
            engineer&apos;s judgement.
          </p>
        </section>
      )}

      <AffectedDocumentsPanel
        changeRequestId={cr.id}
        affected={types.affected}
        register={types.register}
        missing={types.documentsMissing}
        editable={OPEN_STATUSES.includes(cr.status) && can(user.roles, "change.draft")}
        addAction={addAffectedDocumentAction}
        unaffectedAction={confirmUnaffectedAction}
      />

      <section aria-labelledby="impact" className="mb-8">
        <h2 id="impact" className="mb-2 text-lg font-semibold">
          Computed impact
        </h2>
        <ImpactWorking
          assessment={assessment}
          impact={impact}
          raiseReason={page.assessmentRow.raiseReason}
          requirements={requirements}
          matrixVersion={page.matrixVersion}
        />
      </section>

      {page.subject && (
        <section aria-labelledby="subject" className="mb-8">
          <h2 id="subject" className="mb-2 text-lg font-semibold">
            {page.subject.kind === "equipment" ? "Equipment diff" : "Specification diff"}
          </h2>
          <SubjectView subject={page.subject} />
        </section>
      )}

      <section aria-labelledby="diff" className="mb-8">
        <h2 id="diff" className="mb-2 text-lg font-semibold">
          Parameter diff
        </h2>
        <DiffView diff={assessment.diff} />
      </section>

      {editNarrative && narrative && (
        <section aria-labelledby="narrative" className="mb-8">
          <h2 id="narrative" className="mb-1 text-lg font-semibold">
            Justification and risk assessment
          </h2>
          <p className="mb-2 text-sm text-stone-600">
            Why the change, what could go wrong and how the risk is controlled. Saved as you type;
            frozen when you sign the impact assessment.
          </p>
          <DocumentEditorLoader
            versionId={narrative.id}
            initialContent={narrative.content as RichDoc}
            initialLockVersion={narrative.lockVersion}
          />
        </section>
      )}

      <section aria-labelledby="proposal" className="mb-8">
        <h2 id="proposal" className="mb-2 text-lg font-semibold">
          {editing ? "Edit the proposal" : `Proposed version ${toVersion.version}`}
        </h2>
        {editing ? (
          <ProposalEditor
            action={saveProposalAction}
            changeRequestId={cr.id}
            lockVersion={page.assessmentRow.lockVersion}
            title={cr.title}
            kind={page.assessmentRow.kind}
            partFamilyId={page.assessmentRow.partFamilyId}
            families={page.families}
            raisedTo={page.assessmentRow.raisedTo}
            raiseReason={page.assessmentRow.raiseReason}
            computed={assessment.computed}
            recipe={page.to}
          />
        ) : (
          <>
            <h3 className="text-base font-semibold">Justification and risk assessment</h3>
            {narrative ? (
              // Sanitised on the server by the documents renderer.
              <div
                className="prose prose-stone prose-sm mt-1 max-w-3xl"
                dangerouslySetInnerHTML={{ __html: renderRichHtml(narrative.content as RichDoc) }}
              />
            ) : (
              <p className="text-sm text-stone-600">Not written.</p>
            )}
            <div className="mt-4 rounded-lg border border-stone-200 bg-white p-5">
              <RecipeTable
                content={page.to}
                caption={`Parameters of proposed version ${toVersion.version}`}
              />
            </div>
          </>
        )}
      </section>

      <section aria-labelledby="signatures" className="mb-8">
        <h2 id="signatures" className="mb-2 text-lg font-semibold">
          Signatures
        </h2>
        <SignatureList signatures={page.signatures} />
        {page.earlierSignatures.length > 0 && (
          <details className="mt-3 text-sm">
            <summary className="cursor-pointer">Signatures on earlier revisions</summary>
            <SignatureList signatures={page.earlierSignatures} />
          </details>
        )}
        <p className="mt-2 font-mono text-xs break-all text-stone-500">
          Content hash of this revision: {page.contentHash}
        </p>
      </section>
    </>
  );
}

/** A change request that exists but whose page cannot be built (its versions are missing). */
async function UnshownChange({ changeId, reason }: { changeId: string; reason: string }) {
  const heading = await getChangeRequestHeading(changeId);
  if (!heading) notFound();
  return (
    <>
      <PageHeader
        title={`${heading.number} · ${heading.title}`}
        description={
          <>
            Status: <span className="font-semibold">{CHANGE_STATUS_LABELS[heading.status]}</span> ·{" "}
            {heading.recipeCode} · opened by {heading.author} on {formatDate(heading.createdAt)}
          </>
        }
      />
      <EmptyState title="This change request cannot be shown in full">
        <p>{reason}</p>
        <p className="mt-2">
          Its parameter diff, impact and signatures need the recipe versions it compares. Its events
          stay in the audit trail. Other change requests with this status are in the{" "}
          <IntentLink
            href={`/changes?status=${heading.status}`}
            className="text-brand-800 hover:underline"
          >
            change list
          </IntentLink>
          .
        </p>
      </EmptyState>
    </>
  );
}
