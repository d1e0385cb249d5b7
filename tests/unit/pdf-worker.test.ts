import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { doc, h, p, ul, type RichNode } from "@/lib/documents/rich-text";
import type { DocumentPdfInput } from "@/lib/pdf/document-pdf";
import { renderPdf } from "@/lib/server/pdf/render-pdf";

const base: DocumentPdfInput = {
  number: "VP-0042",
  title: "Performance qualification of the valve-body wash",
  typeLabel: "Validation protocol",
  version: 1,
  status: "draft",
  effectiveDate: null,
  contentHash: null,
  content: doc(
    h(1, "Purpose"),
    p("Show that the wash at 60 °C ± 2 °C meets CCC = A(N)B(5000)C(700)D(70)E(10)F(1)."),
  ),
  signatures: [],
  printedAt: "2026-12-02T10:00:00.000Z",
  printedBy: "Ines Varga",
  letterhead: { companyName: "Fennmoor Fluidtech", siteName: "Larchfield plant" },
};

const nested = (levels: number): RichNode =>
  levels === 1 ? ul("innermost") : ul(nested(levels - 1));
const text = (bytes: Uint8Array) =>
  execFileSync("pdftotext", ["-", "-"], { input: bytes, encoding: "utf8" });

describe("PDFs render in a worker process", () => {
  it("renders a document to PDF bytes", async () => {
    const bytes = await renderPdf({ kind: "document", input: base });
    expect(Buffer.from(bytes.subarray(0, 5)).toString("latin1")).toBe("%PDF-");
    expect(text(bytes)).toContain("VP-0042");
    // Every page's header names whose record it is.
    expect(text(bytes)).toContain("Fennmoor Fluidtech · Larchfield plant");
  }, 60_000);

  it("answers a document that cannot be rendered with its own error, and the next PDF still renders", async () => {
    // Saved content is limited to 10 nested lists; this is what an older or imported record could hold.
    const hostile = { ...base, content: doc(nested(400)) };
    await expect(renderPdf({ kind: "document", input: hostile })).rejects.toThrow(
      /could not be rendered as a PDF.*Other PDFs are not affected/,
    );
    const after = await renderPdf({ kind: "document", input: { ...base, number: "VP-0043" } });
    expect(text(after)).toContain("VP-0043");
  }, 120_000);

  it("renders jobs one at a time, each answered with its own bytes", async () => {
    const numbers = ["VP-0101", "VP-0102", "VP-0103"];
    const all = await Promise.all(
      numbers.map((number) => renderPdf({ kind: "document", input: { ...base, number } })),
    );
    all.forEach((bytes, i) => expect(text(bytes)).toContain(numbers[i]));
  }, 120_000);
});
