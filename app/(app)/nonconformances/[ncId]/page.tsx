import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import {
  AddActionForm,
  AdvanceForm,
  AssignForm,
  CancelForm,
  DispositionForm,
  HoldButtons,
  PendingItemsHoldButtons,
  NcFileUpload,
  OpenChangeFromActionForm,
  PlanEffectivenessForm,
  RecordEffectivenessForm,
  RootCauseForm,
  UpdateActionForm,
} from "@/components/nonconformances/nc-forms";
import { NcStatusWord, SeverityWord } from "@/components/nonconformances/nc-words";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { PageHeader } from "@/components/ui/page-header";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import type { RichDoc } from "@/lib/documents/rich-text";
import { formatDate, formatDateTime, todayUtc } from "@/lib/format/date";
import {
  closureProblem,
  NC_ACTION_STATUS_LABELS,
  NC_DISPOSITION_LABELS,
  NC_FINISHED,
  NC_HOLD_LABELS,
  NC_MANUAL_LABELS,
  NC_METHOD_LABELS,
  NC_SOURCE_LABELS,
  NEXT_STEP_LABELS,
  transitionProblem,
  type NcStatus,
} from "@/lib/nonconformances/lifecycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { loadNonconformancePage } from "@/lib/server/nonconformances/queries";
import { signatureValidity } from "@/lib/signatures/rules";
import { signClosureAction } from "../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ ncId: string }>;
}): Promise<Metadata> {
  return recordTitle("nonconformance", (await params).ncId, "Nonconformance");
}

const NEXT: Partial<Record<NcStatus, NcStatus>> = {
  open: "contained",
  contained: "cause_found",
  cause_found: "actions_under_way",
  actions_under_way: "effectiveness_check",
};

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="mb-8 space-y-3">
      <h2 id={`${id}-title`} className="text-lg font-semibold text-stone-900">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default async function NonconformancePage({
  params,
}: {
  params: Promise<{ ncId: string }>;
}) {
  const user = await requirePageUser("nc.view");
  const { ncId } = await params;
  const page = /^[0-9a-f-]{36}$/.test(ncId) ? await loadNonconformancePage(ncId) : null;
  if (!page) notFound();
  const { nc, facts } = page;
  const works = can(user.roles, "nc.work") && !NC_FINISHED.includes(nc.status);
  const next = NEXT[nc.status];
  const nextProblem = next ? transitionProblem(nc.status, next, facts) : null;
  const recipeOptions = page.recipes.map((r) => ({ value: r.id, label: `${r.code} · ${r.name}` }));
  const fileOptions = page.files.map((f) => ({ value: f.id, label: f.name }));
  const people = page.people.map((p) => ({ value: p.id, label: p.name }));
  const authored = page.signatures.find(
    (s) => s.meaning === "authored" && s.contentHash === page.hash,
  );
  const readyToClose = nc.status === "effectiveness_check" && closureProblem(facts) === null;
  return (
    <>
      <PageHeader
        title={`${nc.number} · ${nc.title}`}
        description={
          <span className="flex flex-wrap gap-x-4 gap-y-1">
            <NcStatusWord status={nc.status} />
            <span>
              Severity: <SeverityWord severity={nc.severity} />
            </span>
            <span>Detected {formatDate(nc.detectedOn)}</span>
            {page.recipeCode && <span>Recipe {page.recipeCode}</span>}
            {page.familyCode && (
              <span>
                Part family {page.familyCode} · {page.familyName}
              </span>
            )}
          </span>
        }
      />
      <Section id="summary" title="What was found">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-stone-500">Source</dt>
          <dd>
            {nc.manualKind ? NC_MANUAL_LABELS[nc.manualKind] : NC_SOURCE_LABELS[nc.sourceKind]}:{" "}
            {page.sourceRun ? (
              <IntentLink
                href={`/evidence/runs/${page.sourceRun.id}`}
                className="text-brand-800 underline"
              >
                {nc.sourceLabel}
              </IntentLink>
            ) : (
              nc.sourceLabel
            )}
          </dd>
          <dt className="text-stone-500">Owner</dt>
          <dd>
            {page.owner ?? "not assigned"}
            {nc.dueOn && ` · due ${formatDate(nc.dueOn)}`}
          </dd>
          {nc.cancelReason && (
            <>
              <dt className="text-stone-500">Cancelled because</dt>
              <dd>{nc.cancelReason}</dd>
            </>
          )}
        </dl>
        <p className="whitespace-pre-line text-sm text-stone-800">{nc.description}</p>
        {works && (
          <AssignForm
            ncId={nc.id}
            engineers={page.engineers.map((e) => ({ value: e.id, label: e.name }))}
            ownerId={nc.ownerId}
            dueOn={nc.dueOn}
          />
        )}
        {works && next && (
          <div className="rounded-md border border-stone-200 bg-stone-50 p-3 text-sm">
            <p className="mb-2">
              Next step: <strong>{NEXT_STEP_LABELS[nc.status]}</strong>
              {nextProblem && <span className="block text-stone-700">{nextProblem}</span>}
            </p>
            {!nextProblem && (
              <AdvanceForm ncId={nc.id} to={next} label={NEXT_STEP_LABELS[nc.status]!} />
            )}
          </div>
        )}
      </Section>

      <Section id="containment" title="Containment">
        <p className="text-sm text-stone-700">
          What was processed on this recipe and part family since the last passing verified test, up
          to when the nonconformance was raised. Hold what may be affected; release what is shown
          not to be.
        </p>
        {works && facts.undecidedItems > 1 && (
          <PendingItemsHoldButtons ncId={nc.id} undecided={facts.undecidedItems} />
        )}
        <Table caption="Affected items" density="compact">
          <THead>
            <Th>Item</Th>
            <Th>Processed</Th>
            <Th>Lots</Th>
            <Th>Hold</Th>
            <Th>Disposition</Th>
          </THead>
          <TBody>
            {page.items.length === 0 && (
              <tr>
                <Td colSpan={5}>
                  No processed items are recorded for this recipe and part family.
                </Td>
              </tr>
            )}
            {page.items.map(({ item, run, recleanRecipe, letterName }) => (
              <tr key={item.id}>
                <Td className="whitespace-nowrap">
                  {run ? (
                    <IntentLink
                      href={`/evidence/runs/${run.id}`}
                      className="text-brand-800 underline"
                    >
                      {item.label}
                    </IntentLink>
                  ) : (
                    item.label
                  )}
                  {run?.outcome && (
                    <span className="block text-xs text-stone-600">outcome {run.outcome}</span>
                  )}
                </Td>
                <Td className="whitespace-nowrap tabular-nums">{formatDate(item.processedAt)}</Td>
                <Td>{item.lots.length ? item.lots.join(", ") : "—"}</Td>
                <Td>
                  <span className="block">{NC_HOLD_LABELS[item.hold]}</span>
                  {works && !item.disposition && (
                    <HoldButtons
                      ncId={nc.id}
                      itemId={item.id}
                      label={item.label}
                      hold={item.hold}
                    />
                  )}
                </Td>
                <Td>
                  {item.disposition ? (
                    <span>
                      {NC_DISPOSITION_LABELS[item.disposition]}
                      {recleanRecipe && ` under ${recleanRecipe}`}
                      {item.concessionReference && ` · concession ${item.concessionReference}`}
                      {letterName && ` (${letterName})`}
                      {item.dispositionNote && (
                        <span className="block text-xs text-stone-600">{item.dispositionNote}</span>
                      )}
                    </span>
                  ) : works && item.hold === "held" ? (
                    <DispositionForm
                      ncId={nc.id}
                      itemId={item.id}
                      label={item.label}
                      recipes={recipeOptions}
                      letters={fileOptions}
                    />
                  ) : (
                    "—"
                  )}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      </Section>

      <Section id="root-cause" title="Root cause">
        {page.rootCauseHtml ? (
          <>
            <p className="text-sm text-stone-700">Method: {NC_METHOD_LABELS[nc.causeMethod!]}</p>
            <div
              className="prose prose-sm max-w-none rounded-md border border-stone-200 bg-white p-3"
              dangerouslySetInnerHTML={{ __html: page.rootCauseHtml }}
            />
          </>
        ) : (
          <p className="text-sm text-stone-600">Not recorded yet.</p>
        )}
        {works && nc.status !== "effectiveness_check" && (
          <RootCauseForm
            ncId={nc.id}
            method={nc.causeMethod}
            content={(nc.rootCause as RichDoc) ?? null}
          />
        )}
      </Section>

      <Section id="actions" title="Actions">
        <Table caption="Corrective and preventive actions" density="compact">
          <THead>
            <Th>Kind</Th>
            <Th>Action</Th>
            <Th>Owner</Th>
            <Th>Due</Th>
            <Th>Status</Th>
            <Th>Evidence</Th>
            <Th>Change request</Th>
          </THead>
          <TBody>
            {page.actions.length === 0 && (
              <tr>
                <Td colSpan={7}>No actions yet.</Td>
              </tr>
            )}
            {page.actions.map(({ action, owner, changeNumber, changeStatus }) => (
              <tr key={action.id}>
                <Td>{action.kind === "corrective" ? "Corrective" : "Preventive"}</Td>
                <Td>{action.description}</Td>
                <Td>{owner}</Td>
                <Td className="whitespace-nowrap tabular-nums">{formatDate(action.dueOn)}</Td>
                <Td>
                  {NC_ACTION_STATUS_LABELS[action.status]}
                  {works && action.status !== "done" && (
                    <UpdateActionForm
                      ncId={nc.id}
                      actionId={action.id}
                      label={action.description}
                      status={action.status}
                      evidenceLink={action.evidenceLink}
                    />
                  )}
                </Td>
                <Td>{action.evidenceLink ?? "—"}</Td>
                <Td>
                  {action.changeRequestId ? (
                    <IntentLink
                      href={`/changes/${action.changeRequestId}`}
                      className="text-brand-800 underline"
                    >
                      {changeNumber}
                      {changeStatus && ` (${CHANGE_STATUS_LABELS[changeStatus].toLowerCase()})`}
                    </IntentLink>
                  ) : works &&
                    action.kind === "corrective" &&
                    nc.recipeId &&
                    can(user.roles, "change.draft") ? (
                    <OpenChangeFromActionForm
                      ncId={nc.id}
                      actionId={action.id}
                      label={action.description}
                    />
                  ) : (
                    "—"
                  )}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
        {works && nc.status !== "effectiveness_check" && (
          <AddActionForm ncId={nc.id} people={people} today={todayUtc()} />
        )}
      </Section>

      <Section id="effectiveness" title="Effectiveness check">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-stone-500">Criterion</dt>
          <dd>{nc.effectivenessCriterion ?? "not set"}</dd>
          <dt className="text-stone-500">Due</dt>
          <dd>{formatDate(nc.effectivenessDueOn, "not set")}</dd>
          <dt className="text-stone-500">Result</dt>
          <dd>
            {nc.effectivenessResult === "confirmed" ? "Effective" : "not recorded"}
            {nc.effectivenessCheckedAt && ` · ${formatDateTime(nc.effectivenessCheckedAt)}`}
          </dd>
          <dt className="text-stone-500">Evidence</dt>
          <dd>
            {page.effectivenessRun ? (
              <IntentLink
                href={`/evidence/runs/${page.effectivenessRun.id}`}
                className="text-brand-800 underline"
              >
                {page.effectivenessRun.number}
              </IntentLink>
            ) : nc.effectivenessFileId ? (
              (page.files.find((f) => f.id === nc.effectivenessFileId)?.name ?? "file")
            ) : (
              "—"
            )}
          </dd>
        </dl>
        {works && nc.effectivenessResult !== "confirmed" && (
          <PlanEffectivenessForm
            ncId={nc.id}
            criterion={nc.effectivenessCriterion}
            dueOn={nc.effectivenessDueOn}
          />
        )}
        {works && nc.status === "effectiveness_check" && nc.effectivenessResult !== "confirmed" && (
          <RecordEffectivenessForm ncId={nc.id} files={fileOptions} />
        )}
      </Section>

      <Section id="files" title="Files">
        {page.files.length === 0 ? (
          <p className="text-sm text-stone-600">No files uploaded.</p>
        ) : (
          <ul className="list-disc pl-5 text-sm">
            {page.files.map((f) => (
              <li key={f.id}>
                <a href={`/api/evidence/files/${f.id}`} className="text-brand-800 underline">
                  {f.name}
                </a>{" "}
                <span className="font-mono text-xs text-stone-600">
                  SHA-256 {f.sha256.slice(0, 12)}…
                </span>
              </li>
            ))}
          </ul>
        )}
        {works && <NcFileUpload ncId={nc.id} />}
      </Section>

      <Section id="closure" title="Closure">
        <SignatureList
          signatures={page.signatures.map((s) => ({
            ...s,
            validity: signatureValidity(s.contentHash, page.hash),
          }))}
        />
        {nc.status === "effectiveness_check" && !readyToClose && (
          <p className="text-sm text-stone-700">{closureProblem(facts)}</p>
        )}
        {readyToClose && !authored && can(user.roles, "nc.work") && (
          <SignatureDialog
            action={signClosureAction}
            postsMeaning
            recordType="nonconformance"
            meaning="authored"
            signerName={user.name}
            recordLabel={nc.number}
            contentHash={page.hash}
            hidden={{ nonconformanceId: nc.id }}
            buttonLabel="Sign the investigation for closure"
          />
        )}
        {readyToClose &&
          authored &&
          authored.userId !== user.id &&
          can(user.roles, "nc.approve") && (
            <SignatureDialog
              action={signClosureAction}
              postsMeaning
              recordType="nonconformance"
              meaning="approved"
              signerName={user.name}
              recordLabel={nc.number}
              contentHash={page.hash}
              hidden={{ nonconformanceId: nc.id }}
              buttonLabel="Approve the closure"
            />
          )}
        {works && (
          <details className="text-sm">
            <summary className="cursor-pointer text-stone-700">Cancel this nonconformance</summary>
            <div className="mt-2">
              <CancelForm ncId={nc.id} />
            </div>
          </details>
        )}
      </Section>
    </>
  );
}
