import { ArrowRight } from "lucide-react";
import { STAGE_MODE_LABELS } from "@/lib/format/labels";
import { rangeWithUnit, withUnit } from "@/lib/format/number";
import type { Assessment } from "@/lib/changes/assess";
import type { RecipeDiff } from "@/lib/changes/diff";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

const IMPACT_TEXT = {
  editorial: "Editorial — wording only; approval, no requalification",
  minor: "Minor — approval, no requalification",
  major: "Major — approval and requalification",
} as const;

export function ImpactWord({ impact }: { impact: keyof typeof IMPACT_TEXT | null }) {
  if (!impact) return <span className="text-stone-500">not assessed</span>;
  return (
    <span
      className={`font-semibold ${impact === "major" ? "text-stone-950 underline decoration-2" : "text-brand-800"}`}
    >
      {impact.charAt(0).toUpperCase() + impact.slice(1)}
    </span>
  );
}

const mode = (m: string | null) => (m ? (STAGE_MODE_LABELS[m] ?? m) : "none");

/** Old → new for every parameter that changed, with its validated range and where the new setpoint lies. */
export function DiffView({ diff }: { diff: RecipeDiff }) {
  const rows = diff.parameters.filter((p) => p.change !== "unchanged");
  return (
    <div className="space-y-4">
      {rows.length === 0 && diff.stages.length === 0 && diff.texts.length === 0 ? (
        <p className="text-sm text-stone-600">
          The proposal is the same as the effective version so far.
        </p>
      ) : null}
      {rows.length > 0 && (
        <Table caption="Parameter diff">
          <THead>
            <Th>Stage · parameter</Th>
            <Th align="right">Old</Th>
            <Th aria-hidden="true" />
            <Th>New</Th>
            <Th>Validated range (effective)</Th>
            <Th>New range</Th>
            <Th>New setpoint</Th>
            <Th>Class</Th>
          </THead>
          <TBody>
            {rows.map((p) => (
              <tr key={p.key}>
                <Td>
                  {p.stage} · <span className="font-medium">{p.name}</span>
                  {p.change !== "changed" && (
                    <span className="ml-1 text-xs text-stone-600">({p.change})</span>
                  )}
                </Td>
                <Td numeric>{p.old ? withUnit(p.old.setpoint, p.old.unit) : "—"}</Td>
                <Td className="text-stone-400 [--cell-pl:0.25rem] [--cell-pr:0.25rem]">
                  <ArrowRight className="h-3.5 w-3.5" aria-label="to" />
                </Td>
                <Td className="font-medium tabular-nums">
                  {p.new ? withUnit(p.new.setpoint, p.new.unit) : "—"}
                </Td>
                <Td className="tabular-nums">
                  {p.old ? rangeWithUnit(p.old.validatedLow, p.old.validatedHigh, p.old.unit) : "—"}
                </Td>
                <Td className="tabular-nums">
                  {p.new ? rangeWithUnit(p.new.validatedLow, p.new.validatedHigh, p.new.unit) : "—"}
                </Td>
                <Td>
                  {p.position === null
                    ? "—"
                    : p.position === "inside"
                      ? "Inside range"
                      : "Outside range"}
                </Td>
                <Td>
                  <ImpactWord impact={p.impact} />
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
      {diff.stages.length > 0 && (
        <ul className="list-disc pl-5 text-sm">
          {diff.stages.map((s) => (
            <li key={`${s.stage}-${s.change}`}>
              {s.change === "mode_changed"
                ? `Mode of "${s.stage}": ${mode(s.oldMode)} → ${mode(s.newMode)}`
                : s.reason}{" "}
              — <ImpactWord impact={s.impact} />
            </li>
          ))}
        </ul>
      )}
      {diff.texts.map((t) => (
        <div key={t.field} className="text-sm">
          <p className="font-medium">
            {t.field === "detergent" ? "Detergent" : "Version notes"} (text diff)
          </p>
          <p className="mt-1 rounded-md border border-stone-200 bg-white p-2">
            {t.parts.map((part, i) =>
              part.added ? (
                <ins key={i} className="bg-brand-50 text-brand-900 underline">
                  {part.value}
                </ins>
              ) : part.removed ? (
                <del key={i} className="bg-stone-100 text-stone-600">
                  {part.value}
                </del>
              ) : (
                <span key={i}>{part.value}</span>
              ),
            )}
          </p>
        </div>
      ))}
    </div>
  );
}

/** The computed class with its working: every row that set it, and what the matrix asks for. */
export function ImpactWorking({
  assessment,
  impact,
  raiseReason,
  requirements,
  matrixVersion,
}: {
  assessment: Assessment;
  impact: "editorial" | "minor" | "major";
  raiseReason: string | null;
  requirements: {
    testType: keyof typeof TEST_TYPE_LABELS;
    samples: number;
    confidencePct: number;
    reliabilityPct: number;
    because: string[];
    minCycles?: number | null;
  }[];
  matrixVersion: number | null;
}) {
  const reasons = [
    ...assessment.diff.parameters
      .filter((p) => p.change !== "unchanged")
      .map((p) => ({ impact: p.impact, text: `${p.stage} · ${p.name}: ${p.reasons.join(" ")}` })),
    ...assessment.diff.stages.map((s) => ({ impact: s.impact, text: s.reason })),
    ...assessment.diff.texts.map((t) => ({
      impact: t.impact,
      text: `${t.field === "detergent" ? "Detergent" : "Notes"}: ${t.reason}`,
    })),
    ...assessment.triggers
      .filter((t) => t.subject === "part_family")
      .map((t) => ({
        impact: "major" as const,
        text: `${t.reason} A new application of the process calls for requalification.`,
      })),
  ];
  return (
    <div className="space-y-3 text-sm">
      <p className="text-base">
        Impact: <ImpactWord impact={impact} />{" "}
        <span className="text-stone-600">({IMPACT_TEXT[impact]})</span>
      </p>
      {impact !== assessment.computed && (
        <p>
          Computed class {assessment.computed}, raised to {impact} by the engineer: {raiseReason}
        </p>
      )}
      <details open>
        <summary className="cursor-pointer font-medium">Working</summary>
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {reasons.length === 0 && (
            <li>No parameter, stage, mode or detergent changed: editorial.</li>
          )}
          {reasons.map((r, i) => (
            <li key={i}>
              <ImpactWord impact={r.impact} />: {r.text}
            </li>
          ))}
          <li>
            The change takes the highest class of its rows (product rule: outside a validated range,
            a widened range, a stage or mode added or removed, or a new detergent is major).
          </li>
        </ul>
      </details>
      <section aria-labelledby="required-tests">
        <h3 id="required-tests" className="font-semibold">
          Required requalification tests
        </h3>
        {requirements.length === 0 ? (
          <p className="text-stone-600">
            None:{" "}
            {impact === "major"
              ? "the matrix maps none of these changes to a test."
              : "a minor or editorial change needs approval only."}
          </p>
        ) : (
          <Table density="compact" caption="Required tests" frameClassName="mt-1">
            <THead>
              <Th>Test</Th>
              <Th align="right">Samples</Th>
              <Th>Confidence / reliability</Th>
              <Th>Because</Th>
              <Th align="right">From at least</Th>
            </THead>
            <TBody>
              {requirements.map((r) => (
                <tr key={r.testType}>
                  <Td className="font-medium">{TEST_TYPE_LABELS[r.testType]}</Td>
                  <Td numeric>{r.samples} parts</Td>
                  <Td className="tabular-nums">
                    {r.confidencePct} % / {r.reliabilityPct} %
                  </Td>
                  <Td className="text-stone-700">{r.because.join(" ")}</Td>
                  <Td numeric>{r.minCycles ? `${r.minCycles} cycles` : "—"}</Td>
                </tr>
              ))}
            </TBody>
          </Table>
        )}
        {requirements.length > 0 && (
          <p className="mt-1 text-xs text-stone-600">
            Samples from the success-run theorem with zero failures, n = ln(1 − C) / ln(R) rounded
            up{matrixVersion ? `; requalification matrix version ${matrixVersion}` : ""}. A computed
            pass supports, and never replaces, the customer&apos;s specification and the
            engineer&apos;s judgement.
          </p>
        )}
      </section>
    </div>
  );
}
