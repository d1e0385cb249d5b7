/**
 * The anchors for the protocol PDF, rendered by the same library in the same process right after
 * the protocol itself:
 * - plain: the same words on the same number of pages in the same font, one text a page, no
 *   header, footer or tables (the anchor);
 * - blocks: the same words in the same text blocks as the protocol (each heading, paragraph and
 *   table cell its own text), stacked with no styles, header, footer or tables. It separates the
 *   library's cost per text block from the cost of the protocol's own layout.
 */
import { Document, Page, renderToBuffer, StyleSheet, Text } from "@react-pdf/renderer";
import type { Client } from "@libsql/client";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import type { RichNode } from "@/lib/documents/rich-text";
import { renderDocumentPdf, type DocumentPdfInput } from "@/lib/pdf/document-pdf";
import { PDF_FONT } from "@/lib/pdf/fonts";

const s = StyleSheet.create({
  // The protocol's page: A4, its margins, font and size.
  page: { fontFamily: PDF_FONT, fontSize: 9.5, paddingVertical: 24, paddingHorizontal: 48 },
});

/** Every word of a rich-text document, in reading order. */
export function wordsOf(node: RichNode): string[] {
  const own = node.type === "text" && node.text ? node.text.split(/\s+/).filter(Boolean) : [];
  return [...own, ...(node.content ?? []).flatMap(wordsOf)];
}

/** Counts the pages in a PDF's bytes, as the benchmark counts the served protocol's. */
export const pageCount = (bytes: Uint8Array) =>
  (
    Buffer.from(bytes)
      .toString("latin1")
      .match(/\/Type\s*\/Page[^s]/g) ?? []
  ).length;

export function renderPlain(words: string[], pages: number) {
  const perPage = Math.ceil(words.length / pages);
  return renderToBuffer(
    <Document>
      {Array.from({ length: pages }, (_, i) => (
        <Page key={i} size="A4" style={s.page}>
          <Text>{words.slice(i * perPage, (i + 1) * perPage).join(" ")}</Text>
        </Page>
      ))}
    </Document>,
  );
}

/** The text of every heading and paragraph (table cells and list items hold paragraphs). */
export function textBlocksOf(node: RichNode): string[] {
  if (node.type === "paragraph" || node.type === "heading") return [wordsOf(node).join(" ")];
  return (node.content ?? []).flatMap(textBlocksOf);
}

export function renderBlocks(blocks: string[]) {
  return renderToBuffer(
    <Document>
      <Page size="A4" style={s.page}>
        {blocks.map((b, i) => (
          <Text key={i}>{b}</Text>
        ))}
      </Page>
    </Document>,
  );
}

async function timed<T>(fn: () => Promise<T>) {
  const started = performance.now();
  const result = await fn();
  return { ms: performance.now() - started, result };
}

/** Renders the protocol and its two anchors in turn, `times` each; the best of each. */
export async function measurePdfPair(client: Client, documentId: string, times = 2) {
  const row = (
    await client.execute({
      sql: `select d.number, d.title, d.type, v.version, v.status, v.effective_date, v.content_hash, v.content
            from documents d join document_versions v on v.document_id = d.id
            where d.id = ? order by v.version desc limit 1`,
      args: [documentId],
    })
  ).rows[0];
  const content = JSON.parse(String(row.content)) as RichNode;
  const input: DocumentPdfInput = {
    number: String(row.number),
    title: String(row.title),
    typeLabel: TYPE_LABELS[row.type as keyof typeof TYPE_LABELS],
    version: Number(row.version),
    status: row.status as DocumentPdfInput["status"],
    effectiveDate: row.effective_date as string | null,
    contentHash: row.content_hash as string | null,
    content,
    signatures: [],
    printedAt: new Date().toISOString(),
    printedBy: "Benchmark",
    letterhead: { companyName: "Fennmoor Fluidtech", siteName: "Larchfield plant" },
  };
  const words = wordsOf(content);
  const blocks = textBlocksOf(content);
  let protocol = Infinity;
  let plain = Infinity;
  let blocksMs = Infinity;
  let pages = 0;
  let plainPages = 0;
  for (let i = 0; i < times; i++) {
    const p = await timed(() => renderDocumentPdf(input));
    protocol = Math.min(protocol, p.ms);
    pages = pageCount(p.result);
    const q = await timed(() => renderPlain(words, pages));
    plain = Math.min(plain, q.ms);
    plainPages = pageCount(q.result);
    blocksMs = Math.min(blocksMs, (await timed(() => renderBlocks(blocks))).ms);
  }
  return {
    protocolMs: protocol,
    plainMs: plain,
    blocksMs,
    blocks: blocks.length,
    pages,
    plainPages,
    words: words.length,
  };
}
