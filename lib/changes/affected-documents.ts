export interface AffectedDocumentVersion {
  version: number;
  status: "draft" | "in_review" | "approved" | "effective" | "superseded" | "retired";
  effectiveDate: string | null;
  createdAt: string;
}

/**
 * The version that revises a document for a change: made after the change was opened
 * and put in force through the document workflow (effective now, or effective and since
 * superseded by a later revision). A draft or an approval alone does not count.
 */
export function revisionSince(
  versions: readonly AffectedDocumentVersion[],
  changeOpenedAt: string,
): AffectedDocumentVersion | null {
  const inForce = versions
    .filter(
      (v) =>
        v.createdAt > changeOpenedAt &&
        v.effectiveDate !== null &&
        (v.status === "effective" || v.status === "superseded"),
    )
    .sort((a, b) => a.version - b.version);
  return inForce[0] ?? null;
}

export interface AffectedDocument {
  number: string;
  title: string;
  revisedBy: AffectedDocumentVersion | null;
  unaffectedReason: string | null;
}

/**
 * What stops closure (issue #13 item 6): each listed document is revised after the change
 * was opened or confirmed unaffected with a reason. One line per document, naming it.
 */
export function affectedDocumentsMissing(documents: readonly AffectedDocument[]): string[] {
  return documents
    .filter((d) => d.revisedBy === null && !d.unaffectedReason?.trim())
    .map(
      (d) =>
        `${d.number} ${d.title}: no effective revision since the change was opened, and not confirmed unaffected`,
    );
}
