import { ArrowRight } from "lucide-react";
import { STAGE_MODE_LABELS } from "@/lib/format/labels";
import { rangeWithUnit, withUnit } from "@/lib/format/number";
import type { Assessment } from "@/lib/recipes/assess";
import type { RecipeDiff } from "@/lib/recipes/diff";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";

const IMPACT_TEXT = {
  editorial: "Editorial — wording only; approval, no requalification",
  minor: "Minor — approval, no requalification",
  major: "Major — approval and requalification",
} as const;

export function ImpactWord({ impact }: { impact: keyof typeof IMPACT_TEXT | null }) {
  if (!impact) return <span className="text-stone-500">not assessed</span>;
  return <span className={`font-semibold ${impact === "major" ? "text-stone-950 underline decoration-2" : "text-brand-800"}`}>{impact.charAt(0).toUpperCase() + impact.slice(1)}</span>;
}

const mode = (m: string | null) => (m ? (STAGE_MODE_LABELS[m] ?? m) : "none");

/** Old → new for every parameter that changed, with its validated range and where the new setpoint lies. */
export function DiffView({ diff }: { diff: RecipeDiff }) {
  const rows = diff.parameters.filter((p) => p.change !== "unchanged");
  return (
    <div className="space-y-4">
      {rows.length === 0 && diff.stages.length === 0 && diff.texts.length === 0 ? (
        <p className="text-sm text-stone-600">The proposal is the same as the effective version so far.</p>
      ) : null}
      {rows.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <caption className="sr-only">Parameter diff</caption>
            <thead className="bg-stone-50 text-left text-xs text-stone-500 uppercase">
              <tr>
                <th className="px-3 py-2 font-medium">Stage · parameter</th>
                <th className="px-3 py-2 text-right font-medium">Old</th>
                <th className="px-3 py-2 font-medium" aria-hidden="true" />
                <th className="px-3 py-2 font-medium">New</th>
                <th className="px-3 py-2 font-medium">Validated range (effective)</th>
                <th className="px-3 py-2 font-medium">New range</th>
                <th className="px-3 py-2 font-medium">New setpoint</th>
                <th className="px-3 py-2 font-medium">Class</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-stone-100">
              {rows.map((p) => (
                <tr key={p.key}>
                  <td className="px-3 py-2">
                    {p.stage} · <span className="font-medium">{p.name}</span>
                    {p.change !== "changed" && <span className="ml-1 text-xs text-stone-600">({p.change})</span>}
                  </td>
                  <td className="px-3 py-2 text-right tabular-nums">{p.old ? withUnit(p.old.setpoint, p.old.unit) : "—"}</td>
                  <td className="px-1 py-2 text-stone-400">
                    <ArrowRight className="h-3.5 w-3.5" aria-label="to" />
                  </td>
                  <td className="px-3 py-2 font-medium tabular-nums">{p.new ? withUnit(p.new.setpoint, p.new.unit) : "—"}</td>
                  <td className="px-3 py-2 tabular-nums">{p.old ? rangeWithUnit(p.old.validatedLow, p.old.validatedHigh, p.old.unit) : "—"}</td>
                  <td className="px-3 py-2 tabular-nums">{p.new ? rangeWithUnit(p.new.validatedLow, p.new.validatedHigh, p.new.unit) : "—"}</td>
                  <td className="px-3 py-2">{p.position === null ? "—" : p.position === "inside" ? "Inside range" : "Outside range"}</td>
                  <td className="px-3 py-2">
                    <ImpactWord impact={p.impact} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {diff.stages.length > 0 && (
        <ul className="list-disc pl-5 text-sm">
          {diff.stages.map((s) => (
            <li key={`${s.stage}-${s.change}`}>
              {s.change === "mode_changed" ? `Mode of "${s.stage}": ${mode(s.oldMode)} → ${mode(s.newMode)}` : s.reason} — <ImpactWord impact={s.impact} />
            </li>
          ))}
        </ul>
      )}
      {diff.texts.map((t) => (
        <div key={t.field} className="text-sm">
          <p className="font-medium">{t.field === "detergent" ? "Detergent" : "Version notes"} (text diff)</p>
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
  requirements: { testType: keyof typeof TEST_TYPE_LABELS; samples: number; confidencePct: number; reliabilityPct: number; because: string[] }[];
  matrixVersion: number | null;
}) {
  const reasons = [
    ...assessment.diff.parameters.filter((p) => p.change !== "unchanged").map((p) => ({ impact: p.impact, text: `${p.stage} · ${p.name}: ${p.reasons.join(" ")}` })),
    ...assessment.diff.stages.map((s) => ({ impact: s.impact, text: s.reason })),
    ...assessment.diff.texts.map((t) => ({ impact: t.impact, text: `${t.field === "detergent" ? "Detergent" : "Notes"}: ${t.reason}` })),
    ...assessment.triggers.filter((t) => t.subject === "part_family").map((t) => ({ impact: "major" as const, text: `${t.reason} A new application of the process calls for requalification.` })),
  ];
  return (
    <div className="space-y-3 text-sm">
      <p className="text-base">
        Impact: <ImpactWord impact={impact} /> <span className="text-stone-600">({IMPACT_TEXT[impact]})</span>
      </p>
      {impact !== assessment.computed && (
        <p>
          Computed class {assessment.computed}, raised to {impact} by the engineer: {raiseReason}
        </p>
      )}
      <details open>
        <summary className="cursor-pointer font-medium">Working</summary>
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {reasons.length === 0 && <li>No parameter, stage, mode or detergent changed: editorial.</li>}
          {reasons.map((r, i) => (
            <li key={i}>
              <ImpactWord impact={r.impact} />: {r.text}
            </li>
          ))}
          <li>The change takes the highest class of its rows (product rule: outside a validated range, a widened range, a stage or mode added or removed, or a new detergent is major).</li>
        </ul>
      </details>
      <section aria-labelledby="required-tests">
        <h3 id="required-tests" className="font-semibold">
          Required requalification tests
        </h3>
        {requirements.length === 0 ? (
          <p className="text-stone-600">None: {impact === "major" ? "the matrix maps none of these changes to a test." : "a minor or editorial change needs approval only."}</p>
        ) : (
          <table className="mt-1 w-full text-sm">
            <caption className="sr-only">Required tests</caption>
            <thead className="text-left text-xs text-stone-500 uppercase">
              <tr>
                <th className="py-1 pr-3 font-medium">Test</th>
                <th className="py-1 pr-3 text-right font-medium">Samples</th>
                <th className="py-1 pr-3 font-medium">Confidence / reliability</th>
                <th className="py-1 font-medium">Because</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-stone-100">
              {requirements.map((r) => (
                <tr key={r.testType}>
                  <td className="py-1.5 pr-3 font-medium">{TEST_TYPE_LABELS[r.testType]}</td>
                  <td className="py-1.5 pr-3 text-right tabular-nums">{r.samples} parts</td>
                  <td className="py-1.5 pr-3 tabular-nums">
                    {r.confidencePct} % / {r.reliabilityPct} %
                  </td>
                  <td className="py-1.5 text-stone-700">{r.because.join(" ")}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {requirements.length > 0 && (
          <p className="mt-1 text-xs text-stone-600">
            Samples from the success-run theorem with zero failures, n = ln(1 − C) / ln(R) rounded up{matrixVersion ? `; requalification matrix version ${matrixVersion}` : ""}. A computed pass supports, and never replaces, the customer&apos;s specification and the engineer&apos;s judgement.
          </p>
        )}
      </section>
    </div>
  );
}
