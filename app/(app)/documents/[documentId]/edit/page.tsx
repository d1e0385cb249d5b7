import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { DocumentEditorLoader } from "@/components/documents/document-editor-loader";
import { StatusBadge } from "@/components/documents/status-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { lastReturn } from "@/lib/documents/rounds";
import { formatDate } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getDocumentAndVersion } from "@/lib/server/documents/queries";

export const metadata: Metadata = { title: "Edit draft" };

export default async function EditDocumentPage({
  params,
  searchParams,
}: {
  params: Promise<{ documentId: string }>;
  searchParams: Promise<{ version?: string }>;
}) {
  await requirePageUser("document.draft");
  const { documentId } = await params;
  const found = await getDocumentAndVersion(documentId, (await searchParams).version);
  if (!found) notFound();
  const { document, version } = found;
  const back = `/documents/${documentId}?version=${version.version}`;
  // The author answers the comment while editing, so it stays in view above the text.
  const returned = version.status === "draft" ? lastReturn(version.reviews) : null;
  return (
    <>
      <PageHeader
        title={`${document.number} — ${document.title}`}
        description={
          <>
            Version {version.version} <StatusBadge status={version.status} />
            {version.changeReason && (
              <span className="ml-2">Reason for this version: {version.changeReason}</span>
            )}
          </>
        }
        actions={
          <IntentLink
            href={back}
            className="rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-100"
          >
            Back to the document
          </IntentLink>
        }
      />
      {returned && (
        <section
          aria-label="Returned with comments"
          className="mb-4 rounded-lg border border-amber-300 bg-amber-50 p-4 text-sm"
        >
          <p>
            {returned.by} {returned.decision === "rejected" ? "rejected" : "sent back"} round{" "}
            {returned.round} on {formatDate(returned.at)}:
          </p>
          <blockquote className="mt-1 border-l-4 border-amber-400 pl-3 whitespace-pre-wrap">
            {returned.comment}
          </blockquote>
        </section>
      )}
      {version.status === "draft" ? (
        <DocumentEditorLoader
          versionId={version.id}
          initialContent={version.content}
          initialLockVersion={version.lockVersion}
        />
      ) : (
        <EmptyState title="This version is not a draft">
          Only a draft can be edited. To change an approved or effective text, start a new version
          from the document page.
        </EmptyState>
      )}
    </>
  );
}
