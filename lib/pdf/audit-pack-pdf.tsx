import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";
import { showsEmergency } from "@/lib/changes/emergency";
import type { ReactNode } from "react";
import { humanize } from "@/lib/format/labels";
import { formatBytes, rangeWithUnit, withUnit } from "@/lib/format/number";
import { CHANGE_KIND_LABELS, CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { MEANING_LABELS, meaningStatement } from "@/lib/signatures/rules";
import { BINDING_LABELS, OUTCOME_LABELS } from "@/lib/trace/labels";
import type { AuditPack } from "@/lib/server/trace/audit-pack";
import { NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import { formatDateTime } from "@/lib/format/date";
import { letterheadLine, type Letterhead } from "./letterhead";
import { MONO_ADVANCE_EM, PDF_FONT, PDF_MONO_FONT } from "./fonts";

/**
 * Hashes are set in GeistMono at this size: 64 characters take 64 × 0.6 × 6.5 = 249.6 pt, so a
 * SHA-256 always fits on one line of any column at least that wide, and is never hyphenated or cut.
 */
const MONO_SIZE = 6.5;
/** Characters of a hash per line: a whole SHA-256. Longer values (a signature) break every 64 characters, never elsewhere. */
const HASH_LINE = 64;
export const HASH_LINE_WIDTH_PT = HASH_LINE * MONO_ADVANCE_EM * MONO_SIZE;

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
  number: { fontSize: 11, fontWeight: "bold", color: "#12524d" },
  small: { fontSize: 7.5, color: "#57534e" },
  footer: { flexDirection: "row", justifyContent: "space-between" },
  footerLeft: { flex: 1, paddingRight: 24, fontSize: 7, color: "#57534e" },
  footerRight: { fontSize: 7, color: "#57534e" },
  h2: { fontSize: 11.5, fontWeight: "bold", marginTop: 12, marginBottom: 4, color: "#12524d" },
  h3: { fontSize: 9.5, fontWeight: "bold", marginTop: 6, marginBottom: 2 },
  p: { marginBottom: 3, lineHeight: 1.3 },
  table: { borderWidth: 0.5, borderColor: "#a8a29e", marginVertical: 3 },
  row: { flexDirection: "row", borderBottomWidth: 0.5, borderBottomColor: "#d6d3d1" },
  cell: { padding: 2.5, borderRightWidth: 0.5, borderRightColor: "#d6d3d1" },
  head: { backgroundColor: "#f5f5f4", fontWeight: "bold" },
  mono: { fontFamily: PDF_MONO_FONT, fontSize: MONO_SIZE },
  note: { flexDirection: "row", paddingHorizontal: 2.5, paddingBottom: 2.5 },
  noteLabel: { color: "#57534e", marginRight: 4 },
  kv: { flexDirection: "row", marginBottom: 1.5 },
  k: { width: 120, color: "#57534e" },
  v: { flex: 1 },
});

/**
 * A hash or signature in the monospace face, broken only every `perLine` characters (a full-width
 * line holds 128: 128 × 3.9 pt = 499 pt of the page's 515).
 */
function Hash({ value, perLine = HASH_LINE }: { value: string; perLine?: number }) {
  const lines = value.match(new RegExp(`.{1,${perLine}}`, "g")) ?? [value];
  return <Text style={s.mono}>{lines.join("\n")}</Text>;
}

/** `notes`: a full-width line under each row, for a hash too wide to share the row with its columns. */
function Table({
  widths,
  head,
  rows,
  notes,
}: {
  widths: number[];
  head: string[];
  rows: ReactNode[][];
  notes?: ReactNode[];
}) {
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
        <View key={ri} style={[s.row, { flexDirection: "column" }]} wrap={false}>
          <View style={{ flexDirection: "row" }}>
            {r.map((c, ci) => (
              <View key={ci} style={[s.cell, { flex: widths[ci] }]}>
                {typeof c === "string" || typeof c === "number" ? <Text>{c}</Text> : c}
              </View>
            ))}
          </View>
          {notes?.[ri]}
        </View>
      ))}
    </View>
  );
}

/**
 * The newest signed checkpoint, printed in full: with the installation's public key
 * anyone can check that the chain head it names was signed outside the database.
 */
function CheckpointAnchor({ checkpoints: c }: { checkpoints: AuditPack["checkpoints"] }) {
  const cp = c.newest;
  if (!cp) {
    return (
      <Text style={s.p}>
        No signed checkpoint of the audit trail existed at export, so the trail is anchored by its
        own hash chain only.
      </Text>
    );
  }
  const verdict = c.keyProblem
    ? `The checkpoints could not be checked: ${c.keyProblem}`
    : c.breaks.length === 0 && c.unreadable.length === 0
      ? `The trail matches it${c.uncovered > 0 ? `; the ${c.uncovered} later events are covered by the chain alone` : ""}.`
      : `The trail DIFFERS from its signed checkpoints: ${[...c.breaks.map((b) => b.reason), ...c.unreadable.map((n) => `${n} is not a readable checkpoint`)].join("; ")}.`;
  return (
    <View>
      <Text style={s.p}>
        Newest signed checkpoint (kept in the evidence store, outside the database, and e-mailed to
        the auditor): event {cp.seq} at {formatDateTime(cp.at, { seconds: true })}, signed{" "}
        {cp.by === "schedule" ? "on schedule" : `at the request of ${cp.by}`} with Ed25519 key{" "}
        {cp.keyId}. {verdict}
      </Text>
      <Text style={s.small}>Checkpoint hash (SHA-256)</Text>
      <Hash value={cp.hash} />
      <Text style={s.small}>Ed25519 signature</Text>
      <View style={{ marginBottom: 6 }}>
        <Hash value={cp.signature} perLine={2 * HASH_LINE} />
      </View>
    </View>
  );
}

function KV({ k, children }: { k: string; children: ReactNode }) {
  return (
    <View style={s.kv}>
      <Text style={s.k}>{k}</Text>
      <Text style={s.v}>{children}</Text>
    </View>
  );
}

const valueOf = (
  p: {
    setpoint: number;
    unit: string;
    validatedLow: number | null;
    validatedHigh: number | null;
  } | null,
) =>
  p
    ? `${withUnit(p.setpoint, p.unit)} (validated ${rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)})`
    : "—";

export interface AuditPackPdfInput {
  pack: AuditPack;
  printedAt: string;
  printedBy: string;
  letterhead: Letterhead;
}

function AuditPackPdf({ pack, printedAt, printedBy, letterhead }: AuditPackPdfInput) {
  const owner = letterheadLine(letterhead);
  const { cr } = pack;
  const changed = pack.assessment.diff.parameters.filter((p) => p.change !== "unchanged");
  const files = pack.evidence.flatMap((r) => r.files.map((f) => ({ run: r.number, ...f })));
  return (
    <Document title={`Audit pack ${cr.number}`} author="Washproof" subject={cr.title}>
      <Page
        size="A4"
        style={s.page}
        // Header and footer live in the page layout, which lays the content out once rather than again at every break.
        layout={({ children, pageNumber, totalPages }) => (
          <View style={s.frame}>
            <View style={s.header}>
              {owner && <Text style={s.small}>{owner}</Text>}
              <Text style={s.number}>Audit pack · {cr.number}</Text>
              <Text>{cr.title}</Text>
            </View>
            <View style={s.flow}>{children}</View>
            <View style={s.footer}>
              <Text style={s.footerLeft}>
                Audit pack {cr.number} · content hash {pack.contentHash.slice(0, 16)}…
              </Text>
              <Text style={s.footerRight}>{`Page ${pageNumber} of ${totalPages}`}</Text>
            </View>
          </View>
        )}
      >
        <Text style={s.h2} minPresenceAhead={60}>
          1. The record
        </Text>
        <KV k="Change request">
          {cr.number} · {CHANGE_KIND_LABELS[pack.kind]} · revision {pack.revision}
        </KV>
        <KV k="Status">
          {pack.emergency && showsEmergency(cr.status) ? "EMERGENCY · " : ""}
          {CHANGE_STATUS_LABELS[cr.status]}
        </KV>
        {pack.emergency && (
          <KV k="Emergency change">
            In force before approval from {formatDateTime(pack.emergency.implementedAt)}, signed by{" "}
            {pack.emergency.implementedByName}; approval due by {pack.emergency.approvalDueOn}
            {pack.emergency.escalatedAt
              ? `, escalated ${formatDateTime(pack.emergency.escalatedAt)}`
              : ""}
            . Why: {pack.emergency.justification}
          </KV>
        )}
        <KV k="Recipe">
          {pack.recipe.code} {pack.recipe.name}:{" "}
          {pack.fromVersion
            ? `version ${pack.fromVersion.version} (${humanize(pack.fromVersion.status)})`
            : "no earlier version"}{" "}
          → version {pack.toVersion.version} ({humanize(pack.toVersion.status)})
        </KV>
        {pack.family && <KV k="Adds part family">{`${pack.family.code} ${pack.family.name}`}</KV>}
        {pack.nonconformances.length > 0 && (
          <KV k="Corrective action of">
            {pack.nonconformances
              .map((n) => `${n.number} ${n.title} (${NC_STATUS_LABELS[n.status].toLowerCase()})`)
              .join("; ")}
          </KV>
        )}
        <KV k="Opened">{formatDateTime(cr.createdAt, { seconds: true })}</KV>
        <KV k="Closed">
          {cr.closedAt ? formatDateTime(cr.closedAt, { seconds: true }) : "not closed"}
        </KV>
        <KV k="Version in force">
          {pack.toVersion.effectiveFrom
            ? `version ${pack.toVersion.version} from ${formatDateTime(pack.toVersion.effectiveFrom, { seconds: true })}`
            : pack.fromVersion
              ? `version ${pack.fromVersion.version} (the proposal is not in force)`
              : "none (the first version is not in force yet)"}
        </KV>
        <View style={s.kv}>
          <Text style={s.k}>Content hash (SHA-256)</Text>
          <Hash value={pack.contentHash} />
        </View>

        <Text style={s.h2} minPresenceAhead={60}>
          2. Justification and risk assessment
        </Text>
        {pack.narrative ? (
          pack.narrative.split("\n\n").map((para, i) => (
            <Text key={i} style={s.p}>
              {para}
            </Text>
          ))
        ) : (
          <Text style={s.p}>Not written.</Text>
        )}

        <Text style={s.h2} minPresenceAhead={60}>
          3. Parameter diff
        </Text>
        {changed.length === 0 ? (
          <Text style={s.p}>No parameter changed.</Text>
        ) : (
          <Table
            widths={[2.2, 1, 2.4, 2.4, 1, 3]}
            head={[
              "Parameter",
              "Change",
              pack.fromVersion ? `Version ${pack.fromVersion.version}` : "Before",
              `Version ${pack.toVersion.version}`,
              "Range",
              "Impact and reason",
            ]}
            rows={changed.map((p) => [
              `${p.stage} · ${p.name} (${p.key})`,
              humanize(p.change),
              valueOf(p.old),
              valueOf(p.new),
              p.position ? (p.position === "inside" ? "inside" : "outside") : "—",
              `${humanize(p.impact)}${p.reasons.length ? `: ${p.reasons.join("; ")}` : ""}`,
            ])}
          />
        )}
        {pack.assessment.diff.stages.map((st, i) => (
          <Text key={`st${i}`} style={s.p}>
            Stage {st.stage}: {humanize(st.change)} — {st.reason}
          </Text>
        ))}
        {pack.assessment.diff.texts.map((t, i) => (
          <Text key={`tx${i}`} style={s.p}>
            {humanize(t.field)}: “{t.old}” → “{t.new}” ({humanize(t.impact)})
          </Text>
        ))}

        <Text style={s.h2} minPresenceAhead={60}>
          4. Impact
        </Text>
        <KV k="Impact class">
          {humanize(pack.impact)} (computed {pack.assessment.computed}
          {pack.raiseReason ? `; raised by the engineer: ${pack.raiseReason}` : ""})
        </KV>
        {pack.assessment.triggers.map((t, i) => (
          <Text key={i} style={s.p}>
            • {t.reason}
          </Text>
        ))}
        {pack.requirements.length > 0 ? (
          <Table
            widths={[2, 1, 1, 1]}
            head={["Required test", "Samples", "Confidence", "Reliability"]}
            rows={pack.requirements.map((r) => [
              TEST_TYPE_LABELS[r.testType],
              `${r.samples} parts`,
              `${r.confidencePct} %`,
              `${r.reliabilityPct} %`,
            ])}
          />
        ) : (
          <Text style={s.p}>No requalification tests required.</Text>
        )}

        <Text style={s.h2} minPresenceAhead={60}>
          5. Electronic signatures
        </Text>
        {pack.signatures.length === 0 ? (
          <Text style={s.p}>No signatures.</Text>
        ) : (
          <Table
            widths={[1.6, 1.1, 1.5, 0.6, 3.4, 1.3]}
            head={["Printed name", "Meaning", "Signed (UTC)", "Rev.", "Statement", "Binding"]}
            rows={pack.signatures.map((sig) => [
              sig.printedName,
              MEANING_LABELS[sig.meaning],
              formatDateTime(sig.signedAt, { seconds: true }),
              String(sig.revision),
              meaningStatement("change_request", sig.meaning),
              BINDING_LABELS[sig.binding],
            ])}
            notes={pack.signatures.map((sig) => (
              <View key={sig.id} style={s.note}>
                <Text style={s.noteLabel}>Signed content hash (SHA-256)</Text>
                <Hash value={sig.contentHash} />
              </View>
            ))}
          />
        )}

        <Text style={s.h2} minPresenceAhead={60}>
          6. Requalification evidence
        </Text>
        {pack.evidence.length === 0 ? (
          <Text style={s.p}>No test run is linked to this change request.</Text>
        ) : (
          pack.evidence.map((run) => (
            <View key={run.id} wrap={false}>
              <Text style={s.h3}>
                {run.number}
                {run.revision > 1 ? ` rev. ${run.revision}` : ""} · {TEST_TYPE_LABELS[run.testType]}{" "}
                · computed outcome {run.outcome ? OUTCOME_LABELS[run.outcome] : "not computed"}
              </Text>
              <Text style={s.p}>
                {humanize(run.status)} · {run.samples} samples
                {run.worstCaseSamples ? ` (${run.worstCaseSamples} at worst-case positions)` : ""} ·
                performed {run.performedOn ?? "—"}
                {run.lab ? ` at ${run.lab}` : ""}
              </Text>
              {run.signatures.map((sig) => (
                <View key={sig.id} style={s.p}>
                  <Text>
                    {MEANING_LABELS[sig.meaning]} by {sig.printedName},{" "}
                    {formatDateTime(sig.signedAt, { seconds: true })}: “
                    {meaningStatement("test_run", sig.meaning)}”
                  </Text>
                  <View style={{ flexDirection: "row" }}>
                    <Text style={s.noteLabel}>Signed hash</Text>
                    <Hash value={sig.contentHash} />
                  </View>
                </View>
              ))}
              {run.files.length === 0 && <Text style={s.p}>No files attached.</Text>}
            </View>
          ))
        )}
        <Text style={s.small}>
          A computed pass supports, and never replaces, the customer&apos;s specification and the
          responsible engineer&apos;s judgement.
        </Text>

        <Text style={s.h2} minPresenceAhead={60}>
          7. Evidence files and their hashes
        </Text>
        {files.length === 0 ? (
          <Text style={s.p}>No evidence files are attached to the linked runs.</Text>
        ) : (
          <>
            <Text style={s.p}>
              Each file is stored under its SHA-256. To check a copy, compute its SHA-256 (for
              example `sha256sum FILE`) and compare it with the value here.
            </Text>
            <Table
              widths={[0.9, 2, 0.8, 4.3]}
              head={["Run", "File", "Size", "SHA-256"]}
              rows={files.map((f) => [
                f.run,
                f.originalName,
                formatBytes(f.sizeBytes),
                <Hash key="h" value={f.sha256} />,
              ])}
            />
          </>
        )}

        <Text style={s.h2} minPresenceAhead={60}>
          8. Audit extract
        </Text>
        <Text style={s.p}>
          {pack.events.length} events about this change request, its recipe versions, signatures,
          runs and files. Integrity of the whole audit trail at export:{" "}
          {pack.chain.ok
            ? `intact (${pack.chain.events} events)`
            : `BROKEN in ${pack.chain.breaks.length} place${pack.chain.breaks.length === 1 ? "" : "s"}: ${pack.chain.breaks.map((b) => b.reason).join("; ")}`}
          .
        </Text>
        {pack.chain.ok && pack.chain.lastHash && (
          <View style={[s.kv, { marginBottom: 4 }]}>
            <Text style={s.noteLabel}>Last event hash (SHA-256)</Text>
            <Hash value={pack.chain.lastHash} />
          </View>
        )}
        <CheckpointAnchor checkpoints={pack.checkpoints} />
        <Table
          widths={[0.5, 1.9, 1.5, 2.4, 1.5]}
          head={["Seq", "At (UTC)", "Actor", "Event", "Record"]}
          rows={pack.events.map((e) => [
            String(e.seq),
            formatDateTime(e.at, { seconds: true }),
            e.actorName,
            e.eventType,
            humanize(e.recordType),
          ])}
          notes={pack.events.map((e) => (
            <View key={e.seq} style={s.note}>
              <Text style={s.noteLabel}>Event hash (SHA-256)</Text>
              <Hash value={e.hash} />
            </View>
          ))}
        />

        <Text style={s.small}>
          Printed {formatDateTime(printedAt, { seconds: true })} by {printedBy} from Washproof.
        </Text>
      </Page>
    </Document>
  );
}

export function renderAuditPackPdf(input: AuditPackPdfInput): Promise<Buffer> {
  return renderToBuffer(<AuditPackPdf {...input} />);
}
