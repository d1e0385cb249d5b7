import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";
import type { ReactNode } from "react";
import type { DocumentStatus, SignatureMeaning } from "@/db/enums";
import { DOCUMENT_STATUS_LABELS } from "@/lib/documents/lifecycle";
import type { RichNode } from "@/lib/documents/rich-text";
import { MEANING_LABELS } from "@/lib/signatures/rules";
import { formatDateTime } from "@/lib/format/date";
import { PDF_FONT } from "./fonts";
import { letterheadLine, type Letterhead } from "./letterhead";

const s = StyleSheet.create({
  page: {
    fontFamily: PDF_FONT,
    fontSize: 9.5,
    paddingTop: 24,
    paddingBottom: 24,
    paddingHorizontal: 48,
    color: "#1c1917",
  },
  frame: { flexGrow: 1 },
  flow: { flexGrow: 1, paddingTop: 14, paddingBottom: 14 },
  // Line height on the body only: set on the page, it stops react-pdf drawing the rendered page number.
  body: { lineHeight: 1.35 },
  header: { borderBottomWidth: 1, borderBottomColor: "#12524d", paddingBottom: 6 },
  headerRow: { flexDirection: "row", justifyContent: "space-between" },
  number: { fontSize: 11, fontWeight: "bold", color: "#12524d" },
  small: { fontSize: 8, color: "#57534e" },
  uncontrolled: {
    fontSize: 9,
    fontWeight: "bold",
    color: "#1c1917",
    borderWidth: 1,
    borderColor: "#1c1917",
    paddingHorizontal: 4,
    paddingVertical: 1,
  },
  footer: { flexDirection: "row", justifyContent: "space-between" },
  footerLeft: { flex: 1, paddingRight: 24, fontSize: 7.5, color: "#57534e" },
  footerRight: { fontSize: 7.5, color: "#57534e" },
  h1: { fontSize: 15, fontWeight: "bold", marginTop: 4, marginBottom: 6 },
  h2: { fontSize: 12, fontWeight: "bold", marginTop: 10, marginBottom: 4, color: "#12524d" },
  h3: { fontSize: 10.5, fontWeight: "bold", marginTop: 8, marginBottom: 3 },
  p: { marginBottom: 4 },
  listItem: { flexDirection: "row", marginBottom: 2 },
  bullet: { width: 14 },
  table: { borderWidth: 0.5, borderColor: "#a8a29e", marginVertical: 4 },
  row: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: "#d6d3d1" },
  cell: { flex: 1, padding: 3, borderRightWidth: 0.5, borderRightColor: "#d6d3d1" },
  headCell: {
    flex: 1,
    padding: 3,
    borderRightWidth: 0.5,
    borderRightColor: "#d6d3d1",
    backgroundColor: "#f5f5f4",
    fontWeight: "bold",
  },
  quote: { borderLeftWidth: 2, borderLeftColor: "#a8a29e", paddingLeft: 6, marginVertical: 3 },
  code: { backgroundColor: "#f5f5f4", padding: 4, marginVertical: 3 },
  rule: { borderBottomWidth: 0.5, borderBottomColor: "#a8a29e", marginVertical: 6 },
  sigTitle: { fontSize: 12, fontWeight: "bold", marginTop: 14, marginBottom: 4, color: "#12524d" },
  mono: { fontSize: 7.5 },
});

function inline(nodes: RichNode[] = []): ReactNode[] {
  return nodes.map((n, i) => {
    if (n.type === "hardBreak") return "\n";
    if (n.type !== "text") return null;
    // A run without marks is plain text in its block: a nested Text per run costs the layout a node.
    if (!n.marks?.length) return n.text ?? "";
    const marks = new Set(n.marks.map((m) => m.type));
    const href = n.marks?.find((m) => m.type === "link")?.attrs?.href;
    return (
      <Text
        key={i}
        style={{
          fontWeight: marks.has("bold") ? "bold" : undefined,
          fontStyle: marks.has("italic") ? "italic" : undefined,
          textDecoration: marks.has("strike")
            ? "line-through"
            : marks.has("underline") || href
              ? "underline"
              : undefined,
        }}
      >
        {n.text}
        {href ? ` (${href})` : ""}
      </Text>
    );
  });
}

/** A cell holding one paragraph is that paragraph's text in the cell's box: one node, not three. */
function tableCell(cell: RichNode, key: number): ReactNode {
  const style = cell.type === "tableHeader" ? s.headCell : s.cell;
  const content = cell.content ?? [];
  if (content.length === 1 && content[0].type === "paragraph")
    return (
      <Text key={key} style={style}>
        {inline(content[0].content)}
      </Text>
    );
  return (
    <View key={key} style={style}>
      {content.map((x, i) => block(x, i))}
    </View>
  );
}

function block(node: RichNode, key: number | string, ordinal?: string): ReactNode {
  const children = node.content ?? [];
  switch (node.type) {
    case "heading": {
      const level = Number(node.attrs?.level) || 2;
      return (
        <Text
          key={key}
          style={level === 1 ? s.h1 : level === 2 ? s.h2 : s.h3}
          minPresenceAhead={40}
        >
          {inline(children)}
        </Text>
      );
    }
    case "paragraph":
      return (
        <Text key={key} style={s.p}>
          {inline(children)}
        </Text>
      );
    case "bulletList":
    case "orderedList": {
      const start = Number(node.attrs?.start) || 1;
      return (
        <View key={key} style={{ marginBottom: 3 }}>
          {children.map((item, i) =>
            block(item, i, node.type === "orderedList" ? `${start + i}.` : "•"),
          )}
        </View>
      );
    }
    case "listItem":
      return (
        <View key={key} style={s.listItem} wrap={false}>
          <Text style={s.bullet}>{ordinal}</Text>
          <View style={{ flex: 1 }}>{children.map((c, i) => block(c, i))}</View>
        </View>
      );
    case "table":
      return (
        <View key={key} style={s.table}>
          {children.map((row, r) => (
            <View key={r} style={s.row} wrap={false}>
              {(row.content ?? []).map((cell, c) => tableCell(cell, c))}
            </View>
          ))}
        </View>
      );
    case "blockquote":
      return (
        <View key={key} style={s.quote}>
          {children.map((c, i) => block(c, i))}
        </View>
      );
    case "codeBlock":
      return (
        <Text key={key} style={s.code}>
          {inline(children)}
        </Text>
      );
    case "horizontalRule":
      return <View key={key} style={s.rule} />;
    default:
      return null;
  }
}

export interface PdfSignature {
  printedName: string;
  meaning: SignatureMeaning;
  signedAt: string;
  contentHash: string;
  validity: "valid" | "invalid";
}

export interface DocumentPdfInput {
  number: string;
  title: string;
  typeLabel: string;
  version: number;
  status: DocumentStatus;
  effectiveDate: string | null;
  contentHash: string | null;
  content: RichNode;
  signatures: PdfSignature[];
  printedAt: string;
  printedBy: string;
  letterhead: Letterhead;
}

function DocumentPdf(d: DocumentPdfInput) {
  const owner = letterheadLine(d.letterhead);
  const controlled = d.status === "effective";
  return (
    <Document
      title={`${d.number} version ${d.version} — ${d.title}`}
      author="Washproof"
      subject={d.typeLabel}
    >
      <Page
        size="A4"
        style={s.page}
        // The page layout measures content once and packs it into pages; with fixed
        // header and footer elements every page break laid out the rest of the document again.
        layout={({ children, pageNumber, totalPages }) => (
          <View style={s.frame}>
            <View style={s.header}>
              {owner && <Text style={s.small}>{owner}</Text>}
              <View style={s.headerRow}>
                <Text style={s.number}>
                  {d.number} · Version {d.version}
                </Text>
                {!controlled && <Text style={s.uncontrolled}>UNCONTROLLED COPY</Text>}
              </View>
              <Text>{d.title}</Text>
              <Text style={s.small}>
                {d.typeLabel} · Status: {DOCUMENT_STATUS_LABELS[d.status]} · Effective date:{" "}
                {d.effectiveDate ?? "none"}
              </Text>
            </View>
            <View style={s.flow}>{children}</View>
            <View style={s.footer}>
              <Text style={s.footerLeft}>
                {d.number} v{d.version} ·{" "}
                {d.contentHash ? `SHA-256 ${d.contentHash.slice(0, 16)}…` : "draft"}
                {controlled ? "" : " · Uncontrolled copy"}
              </Text>
              <Text style={s.footerRight}>{`Page ${pageNumber} of ${totalPages}`}</Text>
            </View>
          </View>
        )}
      >
        <View style={s.body}>{(d.content.content ?? []).map((n, i) => block(n, i))}</View>

        <View wrap={false}>
          <Text style={s.sigTitle}>Electronic signatures</Text>
          {d.signatures.length === 0 ? (
            <Text>No signatures on this version.</Text>
          ) : (
            <View style={s.table}>
              <View style={s.row}>
                {["Printed name", "Meaning", "Signed (date and time)", "Binding"].map((h) => (
                  <Text key={h} style={s.headCell}>
                    {h}
                  </Text>
                ))}
              </View>
              {d.signatures.map((sig, i) => (
                <View key={i} style={s.row}>
                  <Text style={s.cell}>{sig.printedName}</Text>
                  <Text style={s.cell}>{MEANING_LABELS[sig.meaning]}</Text>
                  <Text style={s.cell}>{formatDateTime(sig.signedAt, { seconds: true })}</Text>
                  <Text style={s.cell}>
                    {sig.validity === "valid"
                      ? "Valid for this content"
                      : "Invalid: content changed"}
                  </Text>
                </View>
              ))}
            </View>
          )}
          <Text style={s.mono}>
            Content hash (SHA-256): {d.contentHash ?? "none: a draft has no frozen content"}
          </Text>
          <Text style={s.small}>
            Printed {formatDateTime(d.printedAt, { seconds: true })} by {d.printedBy}.{" "}
            {controlled
              ? "Controlled copy as effective at printing; check Washproof for the version in force."
              : "Uncontrolled copy: this version is not in force."}
          </Text>
        </View>
      </Page>
    </Document>
  );
}

export function renderDocumentPdf(input: DocumentPdfInput): Promise<Buffer> {
  return renderToBuffer(<DocumentPdf {...input} />);
}
