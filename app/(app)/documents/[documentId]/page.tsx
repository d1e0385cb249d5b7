import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { FileDown, GitCompare, PenLine } from "lucide-react";
import { RedlineView } from "@/components/documents/redline-view";
import { ReviewerOrder } from "@/components/documents/reviewer-order";
import { RoutingTable } from "@/components/documents/routing-table";
import { changeOfNarrative } from "@/lib/server/changes/queries";
import { StatusBadge } from "@/components/documents/status-badge";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { ActionForm } from "@/components/ui/action-form";
import { ChoiceGroup, DateField, SelectField, TextareaField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { can } from "@/lib/auth/permissions";
import { checkTransition, TYPE_LABELS } from "@/lib/documents/lifecycle";
import { redline } from "@/lib/documents/redline";
import { renderRichHtml } from "@/lib/documents/render-html";
import { lastReturn, previousRouting } from "@/lib/documents/rounds";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getDocumentAndVersion, getRoundText, listSigners } from "@/lib/server/documents/queries";
import { hashContent } from "@/lib/server/documents/shared";
import {
  approveAction,
  newVersionAction,
  rejectAction,
  retireAction,
  sendBackAction,
  signReviewAction,
  submitAction,
} from "../actions";
import { formatDate } from "@/lib/format/date";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ documentId: string }>;
}): Promise<Metadata> {
  return recordTitle("document", (await params).documentId, "Document");
}

const linkButton =
  "inline-flex items-center gap-1.5 rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-100";

function Panel({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section aria-label={title} className="rounded-lg border border-stone-200 bg-white p-4">
      <h2 className="mb-3 font-semibold text-stone-900">{title}</h2>
      {children}
    </section>
  );
}

export default async function DocumentPage({
  params,
  searchParams,
}: {
  params: Promise<{ documentId: string }>;
  searchParams: Promise<{ version?: string }>;
}) {
  const user = await requirePageUser("documents.view");
  const { documentId } = await params;
  const found = await getDocumentAndVersion(documentId, (await searchParams).version);
  if (!found) notFound();
  const { document, version } = found;
  const narrativeOf =
    document.type === "change_narrative" ? await changeOfNarrative(document.id) : null;

  const now = new Date().toISOString();
  const label = `${document.number} version ${version.version}`;
  const hidden = { versionId: version.id, documentId };
  const round = version.reviews.filter((r) => r.round === version.reviewRound);
  const myStep = round.find(
    (r) => r.assigneeId === user.id && r.decision === null && r.activatedAt !== null,
  );
  const allowed = (action: Parameters<typeof checkTransition>[1]) =>
    checkTransition(version.status, action, user.roles, document.type).ok;
  const isLatest = version.version === document.versions[0].version;
  const hasOpenVersion = document.versions.some((v) =>
    ["draft", "in_review", "approved"].includes(v.status),
  );
  const draftHash = version.status === "draft" ? hashContent(version.content) : null;
  const signers = version.status === "draft" && allowed("submit") ? await listSigners() : null;
  const current = version.signatures.filter((s) => s.contentHash === version.contentHash);
  const earlier = version.signatures.filter((s) => s.contentHash !== version.contentHash);
  const returned = lastReturn(version.reviews);
  const routedBefore = previousRouting(version.reviews, version.routing);
  // On a later round, the text as it was when it was last returned, to show what changed since.
  const returnedText =
    version.status === "in_review" && returned && returned.round < version.reviewRound
      ? await getRoundText(version.id, returned.round)
      : null;
  const sinceReturn = returnedText ? redline(returnedText, version.content) : null;

  return (
    <>
      <PageHeader
        title={`${document.number} — ${document.title}`}
        description={[
          TYPE_LABELS[document.type],
          document.system && `${document.system.code} ${document.system.name}`,
          document.family && `${document.family.code} ${document.family.name}`,
          document.recipe && `${document.recipe.code} version ${document.recipe.version}`,
          `owner ${document.owner}`,
        ]
          .filter(Boolean)
          .join(" · ")}
        actions={
          <>
            {document.versions.length > 1 && (
              <IntentLink href={`/documents/${documentId}/compare`} className={linkButton}>
                <GitCompare className="h-4 w-4" aria-hidden="true" /> Compare versions
              </IntentLink>
            )}
            <a
              href={`/api/documents/${documentId}/versions/${version.version}/pdf`}
              className={linkButton}
            >
              <FileDown className="h-4 w-4" aria-hidden="true" /> Download PDF
            </a>
          </>
        }
      />

      <nav aria-label="Versions" className="mb-4 flex flex-wrap gap-2 text-sm">
        {document.versions.map((v) => (
          <IntentLink
            key={v.id}
            href={`/documents/${documentId}?version=${v.version}`}
            aria-current={v.version === version.version ? "page" : undefined}
            className="inline-flex items-center gap-1.5 rounded-md border border-stone-200 bg-white px-2.5 py-1 hover:bg-stone-100 aria-[current=page]:border-brand-600 aria-[current=page]:font-semibold"
          >
            Version {v.version} <StatusBadge status={v.status} />
          </IntentLink>
        ))}
      </nav>

      {sinceReturn && returned && (
        <div className="mb-6">
          <Panel title={`Changed since round ${returned.round}`}>
            <p className="mb-2 text-sm">
              {returned.by} {returned.decision === "rejected" ? "rejected" : "sent back"} round{" "}
              {returned.round}: “{returned.comment}”. Since then {sinceReturn.insertedWords} words
              were added and {sinceReturn.deletedWords} removed.
            </p>
            <RedlineView redline={sinceReturn} />
          </Panel>
        </div>
      )}

      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_26rem]">
        <article aria-label={label} className="min-w-0 rounded-lg border border-stone-200 bg-white">
          {version.status !== "effective" && (
            <p className="border-b border-stone-200 bg-stone-100 px-6 py-2 text-sm font-medium text-stone-700">
              Not in force: this version is {version.status.replace("_", " ")}. Printed copies are
              marked “Uncontrolled copy”.
            </p>
          )}
          <div
            className="prose prose-stone max-w-none px-6 py-4"
            dangerouslySetInnerHTML={{ __html: renderRichHtml(version.content) }}
          />
        </article>

        <div className="space-y-4">
          <Panel title={`Version ${version.version}`}>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1 text-sm">
              <dt className="text-stone-500">Status</dt>
              <dd>
                <StatusBadge status={version.status} />
              </dd>
              <dt className="text-stone-500">Effective date</dt>
              <dd>{version.effectiveDate ?? "—"}</dd>
              <dt className="text-stone-500">Content hash</dt>
              <dd className="font-mono text-xs break-all">
                {version.contentHash ?? "set when submitted"}
              </dd>
              {version.changeReason && (
                <>
                  <dt className="text-stone-500">Reason</dt>
                  <dd>{version.changeReason}</dd>
                </>
              )}
            </dl>
          </Panel>

          {version.status === "draft" && returned && (
            <Panel title="Returned with comments">
              <p className="text-sm">
                {returned.by} {returned.decision === "rejected" ? "rejected" : "sent back"} round{" "}
                {returned.round} on {formatDate(returned.at)}:
              </p>
              <blockquote className="mt-2 border-l-4 border-amber-400 pl-3 text-sm whitespace-pre-wrap">
                {returned.comment}
              </blockquote>
            </Panel>
          )}

          {version.status === "draft" && allowed("edit") && (
            <Panel title="Draft">
              <div className="flex flex-wrap gap-2">
                <IntentLink
                  href={`/documents/${documentId}/edit?version=${version.version}`}
                  className={linkButton}
                >
                  <PenLine className="h-4 w-4" aria-hidden="true" /> Edit draft
                </IntentLink>
                {signers && draftHash && (
                  <SignatureDialog
                    action={submitAction}
                    recordType="document_version"
                    meaning="authored"
                    signerName={user.name}
                    recordLabel={label}
                    contentHash={draftHash}
                    hidden={{ ...hidden, lockVersion: String(version.lockVersion) }}
                    buttonLabel="Submit for review"
                  >
                    <ReviewerOrder
                      reviewers={signers.reviewers
                        .filter((r) => r.id !== user.id)
                        .map((r) => ({
                          id: r.id,
                          label: r.jobTitle ? `${r.name} (${r.jobTitle})` : r.name,
                        }))}
                      chosen={routedBefore?.reviewerIds ?? []}
                    />
                    <SelectField
                      name="approverId"
                      label="Approver"
                      placeholder="— choose —"
                      defaultValue={routedBefore?.approverId ?? undefined}
                      options={signers.approvers
                        .filter((a) => a.id !== user.id)
                        .map((a) => ({
                          value: a.id,
                          label: a.jobTitle ? `${a.name} (${a.jobTitle})` : a.name,
                        }))}
                    />
                    <ChoiceGroup
                      type="radio"
                      name="routing"
                      legend="Reviewers sign"
                      defaultValues={[routedBefore?.routing ?? "sequence"]}
                      options={[
                        { value: "sequence", label: "In sequence, in the order listed" },
                        { value: "parallel", label: "In parallel" },
                      ]}
                      hint="The approver signs after every reviewer."
                    />
                    <DateField
                      name="dueDate"
                      label="Due by (optional)"
                      hint="Without a date, each step is due a set number of days after it opens."
                    />
                  </SignatureDialog>
                )}
              </div>
            </Panel>
          )}

          {myStep?.role === "reviewer" && version.contentHash && (
            <Panel title="Your review">
              <div className="space-y-4">
                <SignatureDialog
                  action={signReviewAction}
                  recordType="document_version"
                  meaning="reviewed"
                  signerName={user.name}
                  recordLabel={label}
                  contentHash={version.contentHash}
                  hidden={hidden}
                />
                <ActionForm action={sendBackAction} className="space-y-2" aria-label="Send back">
                  <input type="hidden" name="versionId" value={version.id} />
                  <input type="hidden" name="documentId" value={documentId} />
                  <TextareaField name="comment" label="What must change" />
                  <SubmitButton variant="secondary">Send back</SubmitButton>
                </ActionForm>
              </div>
            </Panel>
          )}

          {myStep?.role === "approver" && version.contentHash && (
            <Panel title="Your approval">
              <div className="space-y-4">
                <SignatureDialog
                  action={approveAction}
                  recordType="document_version"
                  meaning="approved"
                  signerName={user.name}
                  recordLabel={label}
                  contentHash={version.contentHash}
                  hidden={hidden}
                >
                  <DateField
                    name="effectiveDate"
                    label="Effective from"
                    defaultValue={formatDate(now)}
                    hint="Today makes it effective at once and supersedes the version in force."
                  />
                </SignatureDialog>
                <ActionForm action={rejectAction} className="space-y-2" aria-label="Reject">
                  <input type="hidden" name="versionId" value={version.id} />
                  <input type="hidden" name="documentId" value={documentId} />
                  <TextareaField name="comment" label="Why it is rejected" />
                  <SubmitButton variant="danger">Reject</SubmitButton>
                </ActionForm>
              </div>
            </Panel>
          )}

          {isLatest && !hasOpenVersion && allowed("new_version") && (
            <Panel title="Revise">
              <ActionForm
                action={newVersionAction}
                className="space-y-2"
                aria-label="Start a new version"
              >
                <input type="hidden" name="documentId" value={documentId} />
                <TextareaField name="reason" label="Reason for the new version" rows={2} />
                <SubmitButton variant="secondary">Start a new version</SubmitButton>
              </ActionForm>
            </Panel>
          )}

          {version.status === "effective" && can(user.roles, "document.approve") && (
            <Panel title="Retire">
              <ActionForm action={retireAction} className="space-y-2" aria-label="Retire">
                <input type="hidden" name="documentId" value={documentId} />
                <TextareaField name="reason" label="Reason for retiring" rows={2} />
                <SubmitButton variant="danger">Retire this document</SubmitButton>
              </ActionForm>
            </Panel>
          )}

          <Panel title="Routing">
            {narrativeOf ? (
              <p className="text-sm text-stone-700">
                Not routed on its own: this narrative is reviewed, approved and signed as part of{" "}
                <IntentLink
                  href={`/changes/${narrativeOf.id}`}
                  className="font-semibold text-brand-800 hover:underline"
                >
                  {narrativeOf.number}
                </IntentLink>
                , and its status follows the change request&apos;s.
              </p>
            ) : (
              <RoutingTable reviews={version.reviews} now={now} />
            )}
          </Panel>

          <Panel title="Signatures">
            <SignatureList signatures={current} />
            {earlier.length > 0 && (
              <details className="mt-3 text-sm">
                <summary className="cursor-pointer text-stone-700">
                  Signatures on earlier submissions of this version ({earlier.length})
                </summary>
                <p className="my-2 text-xs text-stone-600">
                  These bind to text that was returned and has changed since; they do not apply to
                  the text shown.
                </p>
                <SignatureList signatures={earlier} />
              </details>
            )}
          </Panel>
        </div>
      </div>
    </>
  );
}
