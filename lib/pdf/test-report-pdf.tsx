import { Document, Image, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";
import type { ReactNode } from "react";
import { formatCount } from "@/lib/cleanliness/format";
import { formatDateTime } from "@/lib/format/date";
import { humanize } from "@/lib/format/labels";
import { formatNumber, withUnit } from "@/lib/format/number";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import {
  ANALYSIS_SYSTEM_LABELS,
  EXTRACTION_PROCEDURE_LABELS,
  PARTICLE_TYPE_LABELS,
  WETTED_AREA_METHOD_LABELS,
} from "@/lib/schemas/lab-details";
import { MEANING_LABELS, meaningStatement } from "@/lib/signatures/rules";
import type { TestReport } from "@/lib/server/lab-report/test-report";
import { OUTCOME_LABELS } from "@/lib/trace/labels";
import { MONO_ADVANCE_EM, PDF_FONT, PDF_MONO_FONT } from "./fonts";
import { letterheadLine } from "./letterhead";

/** As in the audit pack: a whole SHA-256 on one line, 64 × 0.6 em × 6.5 pt = 249.6 pt. */
const MONO_SIZE = 6.5;
export const REPORT_HASH_WIDTH_PT = 64 * MONO_ADVANCE_EM * MONO_SIZE;

const s = StyleSheet.create({
  page: {
    fontFamily: PDF_FONT,
    fontSize: 8.5,
    paddingTop: 22,
    paddingBottom: 22,
    paddingHorizontal: 40,
    color: "#1c1917",
  },
  frame: { flexGrow: 1 },
  flow: { flexGrow: 1, paddingTop: 12, paddingBottom: 12 },
  header: { borderBottomWidth: 1, borderBottomColor: "#12524d", paddingBottom: 5 },
  headerRow: { flexDirection: "row", justifyContent: "space-between" },
  number: { fontSize: 11, fontWeight: "bold", color: "#12524d" },
  small: { fontSize: 7.5, color: "#57534e" },
  marking: {
    fontSize: 9,
    fontWeight: "bold",
    borderWidth: 1,
    borderColor: "#1c1917",
    paddingHorizontal: 4,
    paddingVertical: 1,
  },
  footer: { flexDirection: "row", justifyContent: "space-between" },
  footerLeft: { flex: 1, paddingRight: 24, fontSize: 7, color: "#57534e" },
  footerRight: { fontSize: 7, color: "#57534e" },
  h2: { fontSize: 11, fontWeight: "bold", marginTop: 10, marginBottom: 4, color: "#12524d" },
  h3: { fontSize: 9, fontWeight: "bold", marginTop: 5, marginBottom: 2 },
  p: { marginBottom: 3, lineHeight: 1.3 },
  table: { borderWidth: 0.5, borderColor: "#a8a29e", marginVertical: 3 },
  row: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: "#d6d3d1" },
  cell: { padding: 2.5, borderRightWidth: 0.5, borderRightColor: "#d6d3d1" },
  head: { backgroundColor: "#f5f5f4", fontWeight: "bold" },
  mono: { fontFamily: PDF_MONO_FONT, fontSize: MONO_SIZE },
  kv: { flexDirection: "row", marginBottom: 1.5 },
  k: { width: 150, color: "#57534e" },
  v: { flex: 1 },
  photo: { width: 160, maxHeight: 120, objectFit: "contain", marginTop: 2, marginBottom: 4 },
});

function KV({ k, children }: { k: string; children: ReactNode }) {
  return (
    <View style={s.kv}>
      <Text style={s.k}>{k}</Text>
      <Text style={s.v}>{children}</Text>
    </View>
  );
}

function Table({ widths, head, rows }: { widths: number[]; head: string[]; rows: string[][] }) {
  return (
    <View style={s.table}>
      <View style={[s.row, s.head]} fixed>
        {head.map((h, i) => (
          <Text key={i} style={[s.cell, { flex: widths[i] }]}>
            {h}
          </Text>
        ))}
      </View>
      {rows.map((r, ri) => (
        <View key={ri} style={s.row} wrap={false}>
          {r.map((c, ci) => (
            <Text key={ci} style={[s.cell, { flex: widths[ci] }]}>
              {c}
            </Text>
          ))}
        </View>
      ))}
    </View>
  );
}

const H = ({ children }: { children: ReactNode }) => (
  <Text style={s.h2} minPresenceAhead={50}>
    {children}
  </Text>
);
const dash = (v: string | number | null | undefined, unit?: string) =>
  v === null || v === undefined || v === ""
    ? "—"
    : typeof v === "number"
      ? unit
        ? withUnit(v, unit)
        : formatNumber(v, 2)
      : v;

export interface TestReportPdfInput {
  report: TestReport;
  printedAt: string;
  printedBy: string;
}

function TestReportPdf({ report: r, printedAt, printedBy }: TestReportPdfInput) {
  const owner = letterheadLine(r.letterhead);
  const title = `${r.run.number}${r.run.revision > 1 ? ` rev. ${r.run.revision}` : ""}`;
  const lab = r.lab;
  const method = (kind: "extraction" | "analysis" | "gravimetric") =>
    r.methods?.find((m) => m.kind === kind)?.label ?? null;
  const p = r.particles;
  const marking = r.controlled ? "CONTROLLED COPY" : "UNCONTROLLED COPY";
  const gravimetric = r.run.testType === "gravimetric";
  return (
    <Document
      title={`Test report ${title}`}
      author="Washproof"
      subject={TEST_TYPE_LABELS[r.run.testType]}
    >
      <Page
        size="A4"
        style={s.page}
        // Header and footer live in the page layout, which lays the content out once.
        layout={({ children, pageNumber, totalPages }) => (
          <View style={s.frame}>
            <View style={s.header}>
              <View style={s.headerRow}>
                <View>
                  {owner && <Text style={s.small}>{owner}</Text>}
                  <Text style={s.number}>Test report · {title}</Text>
                  <Text>
                    {TEST_TYPE_LABELS[r.run.testType]} · {r.component.name}
                  </Text>
                </View>
                <Text style={s.marking}>{marking}</Text>
              </View>
            </View>
            <View style={s.flow}>{children}</View>
            <View style={s.footer}>
              <Text style={s.footerLeft}>
                Test report {title} · content hash {r.run.contentHash.slice(0, 16)}… ·{" "}
                {r.controlled ? "Controlled copy" : "Uncontrolled copy"}
              </Text>
              <Text style={s.footerRight}>{`Page ${pageNumber} of ${totalPages}`}</Text>
            </View>
          </View>
        )}
      >
        <H>1. Test and component</H>
        <KV k="Company and site">{owner ?? "—"}</KV>
        <KV k="Test run">
          {title} · {humanize(r.run.status)} · performed {dash(r.run.performedOn)}
          {r.run.lab ? ` at ${r.run.lab}` : ""}
          {r.run.technician ? ` by ${r.run.technician}` : ""}
        </KV>
        <KV k="Component">
          {r.component.name} ({r.component.familyCode}), {r.component.material}
        </KV>
        <KV k="Part number">{r.component.partNumbers.join(", ") || "—"}</KV>
        <KV k="Drawing and revision">
          {[r.component.drawingNumber, r.component.drawingRevision].filter(Boolean).join(" · ") ||
            "—"}
        </KV>
        <KV k="Lot">{dash(r.component.lot)}</KV>
        <KV k="Number of components">{String(r.component.components)}</KV>
        <KV k="Wetted area per component">{withUnit(r.component.wettedAreaCm2, "cm²")}</KV>
        <KV k="Wetted area determined">
          {r.component.wettedAreaMethod
            ? ((WETTED_AREA_METHOD_LABELS as Record<string, string>)[
                r.component.wettedAreaMethod
              ] ?? humanize(r.component.wettedAreaMethod))
            : "not recorded"}
        </KV>

        <H>2. Specification</H>
        <KV k="Specification">
          {r.spec.code} revision {r.spec.revision} · {r.spec.name}
          {r.spec.customer ? ` · ${r.spec.customer}` : ""}
          {r.spec.documentNumber ? ` (${r.spec.documentNumber})` : ""}
        </KV>
        <KV k="Cleanliness limit">{r.spec.ccc}</KV>
        <KV k="Largest particle limits">
          {(Object.keys(r.spec.maxUm) as (keyof typeof r.spec.maxUm)[])
            .map((t) => `${PARTICLE_TYPE_LABELS[t]} ${dash(r.spec.maxUm[t], "µm")}`)
            .join(" · ")}
        </KV>
        {r.spec.gravimetricLimitMg !== null && (
          <KV k="Gravimetric limit">
            {withUnit(r.spec.gravimetricLimitMg, "mg")}{" "}
            {r.spec.gravimetricBasis === "per_1000_cm2" ? "per 1000 cm²" : "per component"}
          </KV>
        )}

        <H>3. Extraction</H>
        {method("extraction") && <KV k="Extraction method">{method("extraction")}</KV>}
        {lab ? (
          <>
            <KV k="Procedure">{EXTRACTION_PROCEDURE_LABELS[lab.extraction.procedure]}</KV>
            <KV k="Extraction liquid">{lab.extraction.liquid}</KV>
            <KV k="Liquid volume">{withUnit(lab.extraction.volumeMl, "mL")}</KV>
            <KV k="Pressure">{dash(lab.extraction.pressureBar, "bar")}</KV>
            <KV k="Flow">{dash(lab.extraction.flowLPerMin, "L/min")}</KV>
            <KV k="Extraction time">{withUnit(lab.extraction.durationS, "s")}</KV>
            <KV k="Controlled surface">{lab.extraction.controlledSurface}</KV>
            <KV k="Number of extractions">{String(lab.extraction.extractions)}</KV>
          </>
        ) : (
          <Text style={s.p}>Extraction method and parameters not recorded with this run.</Text>
        )}
        {p && (
          <>
            <Text style={s.h3}>Declining test</Text>
            {r.evaluation.checks
              .filter((c) => c.title.includes("extraction"))
              .map((c, i) => (
                <View key={i}>
                  <Text style={s.p}>Result: {c.word}</Text>
                  {c.lines.map((l, j) => (
                    <Text key={j} style={s.p}>
                      {l}
                    </Text>
                  ))}
                </View>
              ))}
          </>
        )}

        <H>4. Filter and analysis</H>
        {method("analysis") && <KV k="Analysis method">{method("analysis")}</KV>}
        {method("gravimetric") && <KV k="Gravimetric method">{method("gravimetric")}</KV>}
        {lab ? (
          <>
            <KV k="Filter membrane">
              {lab.filter.material}, pore size {withUnit(lab.filter.poreSizeUm, "µm")}
            </KV>
            <KV k="Analysis system">{ANALYSIS_SYSTEM_LABELS[lab.analysis.system]}</KV>
            <KV k="Magnification">{`${formatNumber(lab.analysis.magnification, 0)}×`}</KV>
            <KV k="Lower size limit">{withUnit(lab.analysis.lowerSizeLimitUm, "µm")}</KV>
            {lab.analysis.system !== "sem_edx" && (
              <Text style={s.small}>
                A light microscope tells particles apart by lustre: “metallic” here means
                reflective; only SEM/EDX confirms the material.
              </Text>
            )}
          </>
        ) : (
          <Text style={s.p}>Filter and analysis system not recorded with this run.</Text>
        )}

        {p && (
          <>
            <H>5. Blank value</H>
            {p.blank ? (
              <Text style={s.p}>
                Blank counts:{" "}
                {Object.entries(p.blank.counts)
                  .map(([k, v]) => `${k} ${v}`)
                  .join(", ") || "no particle"}
                {p.blank.largestUm !== null
                  ? `; largest blank particle ${withUnit(p.blank.largestUm, "µm")}`
                  : ""}
                .
              </Text>
            ) : (
              <Text style={s.p}>No blank value recorded.</Text>
            )}
            {r.evaluation.checks
              .filter((c) => c.title.includes("blank"))
              .map((c, i) => (
                <View key={i}>
                  <Text style={s.p}>Evaluation: {c.word}</Text>
                  {c.lines.map((l, j) => (
                    <Text key={j} style={s.p}>
                      {l}
                    </Text>
                  ))}
                </View>
              ))}
            <Text style={s.small}>
              The blank qualifies the measurement (at most 10 % of the limit per class); it is not
              subtracted from the result.
            </Text>

            <H>6. Particle counts per size class</H>
            <Text style={s.p}>
              Normalised to {p.basisUnit}: {p.basisLine}.
            </Text>
            <Table
              widths={[0.6, 1.4, 1.2, 1.6, 0.8]}
              head={["Class", "Size", "Absolute", `Normalised (${p.basisUnit})`, "Level"]}
              rows={p.rows.map((row) =>
                row.analysed
                  ? [
                      row.key,
                      row.range,
                      String(row.absolute),
                      formatCount(row.normalised!),
                      row.level ?? "—",
                    ]
                  : [row.key, row.range, "not analysed", "not analysed", "—"],
              )}
            />
            <KV k="Cleanliness code">{p.code ?? "not computed"}</KV>
            <Text style={s.small}>The code lists only the size classes analysed.</Text>
            <KV k="Particle types">
              {p.split
                ? `metallic (reflective) ${p.split.metallic}, non-metallic ${p.split.nonMetallic}, fibres ${p.split.fibre}`
                : "split by type not measured"}
            </KV>

            <H>7. Largest particles by type</H>
            {r.largest.length === 0 ? (
              <Text style={s.p}>No largest particle recorded.</Text>
            ) : (
              r.largest.map((l) => (
                <View key={l.type} wrap={false}>
                  <Text style={s.h3}>{PARTICLE_TYPE_LABELS[l.type]}</Text>
                  <Text style={s.p}>
                    Length {withUnit(l.lengthUm, "µm")} · width {dash(l.widthUm, "µm")}
                    {l.sampleLabel ? ` · sample ${l.sampleLabel}` : ""} · limit{" "}
                    {dash(l.limitUm, "µm")}
                    {l.limitUm !== null
                      ? l.lengthUm <= l.limitUm
                        ? ": within"
                        : ": EXCEEDED"
                      : ""}
                  </Text>
                  {l.photo ? (
                    <>
                      <Text style={s.small}>
                        Photo {l.photo.name} (SHA-256 {l.photo.sha256.slice(0, 16)}…)
                      </Text>
                      {l.photo.dataUri && (
                        // react-pdf's Image takes no alt text; the line above names the photo.
                        // eslint-disable-next-line jsx-a11y/alt-text
                        <Image style={s.photo} src={l.photo.dataUri} />
                      )}
                    </>
                  ) : (
                    <Text style={s.small}>Photo: none attached.</Text>
                  )}
                </View>
              ))
            )}
          </>
        )}

        <H>{p ? "8. Gravimetric residue" : "5. Gravimetric residue"}</H>
        {gravimetric ? (
          r.evaluation.samples.map((smp, i) => (
            <Text key={i} style={s.p}>
              {smp.label}: {smp.lines.join("; ")}
            </Text>
          ))
        ) : (
          <Text style={s.p}>Not determined in this run.</Text>
        )}

        <H>{p ? "9. Evaluation" : "6. Evaluation"}</H>
        <KV k="Against">
          {r.spec.code} revision {r.spec.revision}, the revision in force when the run was opened
        </KV>
        <KV k="Result">{OUTCOME_LABELS[r.evaluation.outcome]}</KV>
        {r.evaluation.checks.map((c, i) => (
          <Text key={i} style={s.p}>
            {c.title}: {c.word}
          </Text>
        ))}
        {!gravimetric &&
          r.evaluation.samples.map((smp, i) => (
            <View key={i} wrap={false}>
              <Text style={s.h3}>
                Sample {smp.label}
                {smp.worstCase ? " (worst-case position)" : ""}: {OUTCOME_LABELS[smp.outcome]}
                {smp.code ? ` · ${smp.code}` : ""}
              </Text>
              {smp.lines.map((l, j) => (
                <Text key={j} style={s.p}>
                  {l}
                </Text>
              ))}
            </View>
          ))}

        <H>{p ? "10. Deviations" : "7. Deviations"}</H>
        {r.deviations.length === 0 ? (
          <Text style={s.p}>None recorded.</Text>
        ) : (
          r.deviations.map((d, i) => (
            <Text key={i} style={s.p}>
              • {d}
            </Text>
          ))
        )}

        <H>{p ? "11. Signatures" : "8. Signatures"}</H>
        <View style={s.kv}>
          <Text style={s.k}>Content hash (SHA-256)</Text>
          <Text style={s.mono}>{r.run.contentHash}</Text>
        </View>
        {r.signatures.length === 0 ? (
          <Text style={s.p}>Not signed.</Text>
        ) : (
          r.signatures.map((sig, i) => (
            <View key={i} style={{ marginBottom: 4 }} wrap={false}>
              <Text style={s.p}>
                {MEANING_LABELS[sig.meaning]} by {sig.printedName},{" "}
                {formatDateTime(sig.signedAt, { seconds: true })}: “
                {meaningStatement("test_run", sig.meaning)}”
                {sig.validity === "valid"
                  ? ""
                  : " — NO LONGER VALID: the content changed after signing"}
              </Text>
              <View style={{ flexDirection: "row" }}>
                <Text style={[s.small, { marginRight: 4 }]}>Signed hash</Text>
                <Text style={s.mono}>{sig.contentHash}</Text>
              </View>
            </View>
          ))
        )}
        <Text style={s.small}>
          {r.controlled
            ? "Controlled copy: the run is verified and every signature binds to its content. Check Washproof for a later revision."
            : "Uncontrolled copy: the run is not verified, or a signature no longer binds to its content."}{" "}
          Printed {formatDateTime(printedAt, { seconds: true })} by {printedBy} from Washproof.
        </Text>
      </Page>
    </Document>
  );
}

export function renderTestReportPdf(input: TestReportPdfInput): Promise<Buffer> {
  return renderToBuffer(<TestReportPdf {...input} />);
}
