import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { RedlineView } from "@/components/documents/redline-view";
import { StatusBadge } from "@/components/documents/status-badge";
import { SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { redline } from "@/lib/documents/redline";
import { renderRichHtml } from "@/lib/documents/render-html";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getDocument, getVersion } from "@/lib/server/documents/queries";

export const metadata: Metadata = { title: "Compare versions" };

export default async function ComparePage({
  params,
  searchParams,
}: {
  params: Promise<{ documentId: string }>;
  searchParams: Promise<{ from?: string; to?: string; view?: string }>;
}) {
  await requirePageUser("documents.view");
  const { documentId } = await params;
  const document = await getDocument(documentId);
  if (!document) notFound();
  const sp = await searchParams;
  const numbers = document.versions.map((v) => v.version);
  const to = Number(sp.to) || numbers[0];
  const from = Number(sp.from) || numbers.find((n) => n < to) || numbers.at(-1)!;
  const [a, b] = await Promise.all([getVersion(documentId, from), getVersion(documentId, to)]);
  if (!a || !b) notFound();
  const view = sp.view === "side" ? "side" : "redline";
  const result = redline(a.content, b.content);
  const href = (v: string) => `/documents/${documentId}/compare?from=${from}&to=${to}&view=${v}`;
  return (
    <>
      <PageHeader
        title={`Compare ${document.number}: version ${from} → version ${to}`}
        description={`${result.insertedWords} words inserted, ${result.deletedWords} words deleted.`}
        actions={
          <IntentLink
            href={`/documents/${documentId}`}
            className="rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-100"
          >
            Back to the document
          </IntentLink>
        }
      />
      <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" aria-label="Choose versions">
        {(["from", "to"] as const).map((name) => (
          <SelectField
            key={name}
            name={name}
            label={name === "from" ? "From version" : "To version"}
            dense
            defaultValue={String(name === "from" ? from : to)}
            options={document.versions.map((v) => ({
              value: String(v.version),
              label: `${v.version} (${v.status.replace("_", " ")})`,
            }))}
          />
        ))}
        <input type="hidden" name="view" value={view} />
        <button
          type="submit"
          className="rounded-md border border-stone-300 bg-white px-3 py-1.5 font-medium hover:bg-stone-100"
        >
          Compare
        </button>
        <span className="ml-auto flex gap-2">
          <IntentLink
            href={href("redline")}
            aria-current={view === "redline" ? "page" : undefined}
            className="rounded-md px-2 py-1 aria-[current=page]:bg-brand-100 aria-[current=page]:font-semibold"
          >
            Redline
          </IntentLink>
          <IntentLink
            href={href("side")}
            aria-current={view === "side" ? "page" : undefined}
            className="rounded-md px-2 py-1 aria-[current=page]:bg-brand-100 aria-[current=page]:font-semibold"
          >
            Side by side
          </IntentLink>
        </span>
      </form>
      {view === "redline" ? (
        <RedlineView redline={result} />
      ) : (
        <div className="grid gap-4 lg:grid-cols-2">
          {[a, b].map((v) => (
            <article
              key={v.id}
              aria-label={`Version ${v.version}`}
              className="min-w-0 rounded-lg border border-stone-200 bg-white"
            >
              <h2 className="flex items-center gap-2 border-b border-stone-200 px-4 py-2 text-sm font-semibold">
                Version {v.version} <StatusBadge status={v.status} />
              </h2>
              <div
                className="prose prose-sm prose-stone max-w-none px-4 py-3"
                dangerouslySetInnerHTML={{ __html: renderRichHtml(v.content) }}
              />
            </article>
          ))}
        </div>
      )}
    </>
  );
}
