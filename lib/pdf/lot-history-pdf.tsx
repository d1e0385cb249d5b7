import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";
import { bathLine } from "@/lib/cycles/lot-export";
import { formatDateTime } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import { NC_SEVERITY_LABELS, NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import { TEST_TYPE_LABELS, type TestType } from "@/lib/recipes/test-types";
import type { LotHistory } from "@/lib/server/cycles/lot-history";
import { PDF_FONT } from "./fonts";
import { letterheadLine, type Letterhead } from "./letterhead";

export interface LotHistoryPdfInput {
  history: LotHistory;
  letterhead: Letterhead;
  printedAt: string;
  printedBy: string;
}

const s = StyleSheet.create({
  page: {
    fontFamily: PDF_FONT,
    fontSize: 8.5,
    paddingVertical: 24,
    paddingHorizontal: 40,
    color: "#1c1917",
  },
  frame: { flexGrow: 1 },
  flow: { flexGrow: 1, paddingVertical: 12 },
  header: { borderBottomWidth: 1, borderBottomColor: "#12524d", paddingBottom: 6 },
  title: { fontSize: 12, fontWeight: "bold", color: "#12524d" },
  small: { fontSize: 7.5, color: "#57534e" },
  h2: { fontSize: 10.5, fontWeight: "bold", marginTop: 8, marginBottom: 4, color: "#12524d" },
  cycle: { borderBottomWidth: 0.5, borderBottomColor: "#d6d3d1", paddingVertical: 4 },
  bold: { fontWeight: "bold" },
  footer: {
    flexDirection: "row",
    justifyContent: "space-between",
    fontSize: 7.5,
    color: "#57534e",
  },
});

function LotHistoryPdf({ history: h, letterhead, printedAt, printedBy }: LotHistoryPdfInput) {
  const owner = letterheadLine(letterhead);
  return (
    <Document title={`Lot history ${h.lot}`} author="Washproof" subject="Lot history">
      <Page
        size="A4"
        style={s.page}
        // Header and footer are page chrome in the layout: the content is measured once.
        layout={({ children, pageNumber, totalPages }) => (
          <View style={s.frame}>
            <View style={s.header}>
              {owner && <Text style={s.small}>{owner}</Text>}
              <Text style={s.title}>Lot history {h.lot}</Text>
              <Text style={s.small}>
                {h.cycles.length} cycle(s), {h.cycles.filter((c) => c.flagged).length} flagged ·{" "}
                {h.runs.length} test run(s) · {h.nonconformances.length} nonconformance(s)
              </Text>
            </View>
            <View style={s.flow}>{children}</View>
            <View style={s.footer}>
              <Text>
                Printed {formatDateTime(printedAt)} by {printedBy}
              </Text>
              <Text>{`Page ${pageNumber} of ${totalPages}`}</Text>
            </View>
          </View>
        )}
      >
        <Text style={s.h2}>Wash cycles</Text>
        {h.cycles.length === 0 && <Text>No cycle washed this lot.</Text>}
        {h.cycles.map((c) => (
          <View key={c.id} style={s.cycle} wrap={false}>
            <Text>
              <Text style={s.bold}>{c.cycleNumber}</Text> · {c.system} ·{" "}
              {formatDateTime(c.startedAt)} to {formatDateTime(c.endedAt)} · {c.recipe} v{c.version}{" "}
              · {c.partFamily} · {c.baskets} basket(s) · {c.operator}
            </Text>
            <Text>Lots: {c.lots.join(", ")}</Text>
            <Text>
              Values:{" "}
              {Object.entries(c.actualValues)
                .map(([k, v]) => `${k} ${formatNumber(v)}`)
                .join(" · ") || "none recorded"}
            </Text>
            <Text style={c.flagged ? s.bold : undefined}>
              {c.flagged
                ? `FLAGGED: ${c.flagReasons.join(" ")}`
                : "All values inside their validated ranges."}
            </Text>
            {c.bath.map((b) => (
              <Text key={b.stageName} style={s.small}>
                Bath at start: {bathLine(b)}
              </Text>
            ))}
          </View>
        ))}
        <Text style={s.h2}>Test runs on parts from these cycles</Text>
        {h.runs.length === 0 && <Text>No test run names a cycle of this lot.</Text>}
        {h.runs.map((r) => (
          <Text key={r.id} style={s.cycle}>
            {r.number}
            {r.revision > 1 ? ` rev ${r.revision}` : ""} ·{" "}
            {TEST_TYPE_LABELS[r.testType as TestType] ?? r.testType} · {r.performedOn ?? "no date"}{" "}
            · status {r.status} · outcome {r.outcome ?? "not computed"} · parts from{" "}
            {r.cycles.map((c) => `${c.cycleNumber} (${c.samples})`).join(", ")}
          </Text>
        ))}
        <Text style={s.h2}>Nonconformances naming this lot</Text>
        {h.nonconformances.length === 0 && (
          <Text>No nonconformance names this lot or its cycles.</Text>
        )}
        {h.nonconformances.map((nc) => (
          <Text key={nc.id} style={s.cycle}>
            <Text style={s.bold}>{nc.number}</Text> · {nc.title} · detected {nc.detectedOn} ·{" "}
            {NC_SEVERITY_LABELS[nc.severity]} · {NC_STATUS_LABELS[nc.status]}
            {nc.names.length > 0 ? ` · names ${nc.names.join(", ")}` : ""}
          </Text>
        ))}
      </Page>
    </Document>
  );
}

export function renderLotHistoryPdf(input: LotHistoryPdfInput): Promise<Buffer> {
  return renderToBuffer(<LotHistoryPdf {...input} />);
}
