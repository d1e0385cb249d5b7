import type { ReactNode } from "react";
import { PageHeader } from "@/components/ui/page-header";
import {
  CLEANLINESS_LEVELS,
  DEFAULT_BLANK_MAX_FRACTION,
  DEFAULT_EXTRACTION_MAX_RATIO,
  DEFAULT_MAX_EXTRACTIONS,
  GRAVIMETRY_PRACTICAL_LIMIT_MG,
  ISO4406_SCALE,
  SIZE_CLASSES,
} from "@/lib/cleanliness";
import { D2_N2, D4_N2 } from "@/lib/stats";
import { ISO7888_F25 } from "@/lib/water";
import { CapabilityCalculator } from "./capability-calculator";
import { CccCalculator } from "./ccc-calculator";
import { ExtractionCalculator } from "./extraction-calculator";
import { SampleSizeCalculator } from "./sample-size-calculator";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { formatNumber } from "@/lib/format/number";

const SECTIONS = [
  ["size-classes", "Size classes and cleanliness levels"],
  ["ccc", "Normalisation, cleanliness code and specifications"],
  ["extraction", "Extraction: the declining test"],
  ["blank", "Blank value"],
  ["gravimetry", "Gravimetric residue"],
  ["sample-size", "Sample size for pass/fail tests"],
  ["capability", "Process capability"],
  ["control-chart", "Individuals and moving-range chart"],
  ["iso4406", "Bath and rinse-water particle codes"],
  ["conductivity", "Conductivity at 25 °C"],
  ["wetting", "Wetting tension"],
] as const;

/** Every formula Washproof applies, where it comes from, and calculators that run the same code. */
export function HowWeComputeView() {
  return (
    <>
      <PageHeader
        title="How we compute"
        description="Each computation Washproof applies to test evidence: the formula, the standard it comes from, and calculators that run the very functions the evidence screens use, so you can check the arithmetic yourself."
      />

      <nav
        aria-label="On this page"
        className="mb-8 rounded-lg border border-stone-200 bg-white px-4 py-3"
      >
        <h2 className="text-sm font-semibold text-stone-800">On this page</h2>
        <ol className="mt-2 grid list-decimal gap-x-8 gap-y-1 pl-5 text-sm text-brand-700 sm:grid-cols-2">
          {SECTIONS.map(([id, title]) => (
            <li key={id}>
              <a href={`#${id}`} className="underline-offset-2 hover:underline">
                {title}
              </a>
            </li>
          ))}
        </ol>
        <p className="mt-3 text-xs text-stone-600">
          Sources are tagged: <strong>[std]</strong> read from the standard or a faithful quotation
          of it; <strong>[derived]</strong> computed from sourced values; <strong>[memory]</strong>{" "}
          recalled and not yet confirmed in a text we have read.
        </p>
      </nav>

      <div className="space-y-12">
        <Section
          id="size-classes"
          title="Size classes and cleanliness levels"
          source="ISO 16232:2018 and VDA 19.1:2015 — size classes; table of cleanliness levels"
        >
          <p>
            Particles are sized by their maximum Feret diameter. Each lower bound belongs to its
            class, each upper bound to the next. A level covers normalised counts above the previous
            level&apos;s upper bound up to and including its own; 00 means no particle.
          </p>
          <div className="grid items-start gap-6 lg:grid-cols-2">
            <ReferenceTable
              caption="Size classes [std]"
              head={["Class", "From (µm, inclusive)", "To (µm, exclusive)"]}
              rows={SIZE_CLASSES.map((c) => [
                c.key,
                String(c.minUm),
                c.maxUm === null ? "open" : String(c.maxUm),
              ])}
            />
            <ReferenceTable
              caption="Cleanliness levels: largest count per 1000 cm² or per 100 cm³"
              head={["Level", "Up to and including", "Source"]}
              rows={CLEANLINESS_LEVELS.map((l) => [
                l.level,
                formatNumber(l.upper),
                `[${l.source}]`,
              ])}
            />
          </div>
          <p className="text-xs text-stone-600">
            Bounds tagged [memory] each equal 100 × the ISO 4406 scale bound of the same number,
            which agrees with every level read from the standard. Above level 24 (16,000,000) the
            result reads &gt;24.
          </p>
        </Section>

        <Section
          id="ccc"
          title="Normalisation, cleanliness code and specifications"
          source="ISO 16232:2018 / VDA 19.1:2015 — Component Cleanliness Code (CCC)"
        >
          <Formula>
            {"n_A = n × 1000 / A   (A: total tested area in cm², result per 1000 cm²)\n" +
              "n_V = n × 100 / V    (V: total tested volume in cm³, result per 100 cm³)\n" +
              "N   = n / k          (k: components tested, result per component)"}
          </Formula>
          <p>
            The code opens with A, V or N and lists each class analysed with its level, e.g.{" "}
            <Code>A(E7/F6/G00/H4)</Code>; an N code lists counts per component instead of levels.
            The code starts at the smallest class analysed; classes above the largest particle found
            read 00. When the run records its analysis&apos;s lower size limit, a class below it is
            &ldquo;not analysed&rdquo; and left out of the code, never written as 00, and a
            specification limit on such a class cannot be judged, so the sample is incomplete.
          </p>
          <p>
            A specification uses the same notation. A hyphen joins classes under one limit on their
            sum: in <Code>A(B-E17/F-G14/H-I4/J-K2/L-N00)</Code> classes B to E together may reach
            level 17. Letters written together share a level but are limited each on its own: in{" "}
            <Code>A(EF12/G-H10/I0/J00)</Code> E and F may each have up to 4,000 per 1000 cm², G and
            H together 1,000, I one, J none. A result passes a limit when its normalised count is at
            most the upper bound of the specified level (or, for N, at most the number given).
            Classes missing from the result count as 0; classes missing from the specification are
            not limited.
          </p>
          <CccCalculator />
        </Section>

        <Section
          id="extraction"
          title="Extraction: the declining test"
          source="VDA 19.1:2015 / ISO 16232:2018 — qualification of the extraction procedure"
        >
          <Formula>{"decay value after extraction n:  C_n / (C_1 + C_2 + … + C_n)"}</Formula>
          <p>
            The part is extracted again and again; the extraction is complete at the first n where
            the decay value is at most {DEFAULT_EXTRACTION_MAX_RATIO * 100} %. If that is not
            reached within {DEFAULT_MAX_EXTRACTIONS} extractions, the extraction parameters must be
            changed and the qualification repeated. Check values [derived]: 100, 30, 8 → 8 / 138 =
            5.8 %, complete at n = 3; 100, 40, 20 → 12.5 %, not complete.
          </p>
          <ExtractionCalculator />
        </Section>

        <Section id="blank" title="Blank value" source="VDA 19.1:2015 — blank value">
          <Formula>
            {`blank count in each class (or joined classes) ≤ ${DEFAULT_BLANK_MAX_FRACTION * 100} % × specified limit\n` +
              "no blank particle above the largest allowed size\n" +
              `gravimetric blank ≤ ${DEFAULT_BLANK_MAX_FRACTION * 100} % × residue mass`}
          </Formula>
          <p>
            The blank is the same analysis run without a part. It qualifies the measurement and is
            never subtracted from the result. Where the specification allows no particle in a class
            (level 00 or N limit 0), the blank may hold none there either.
          </p>
        </Section>

        <Section
          id="gravimetry"
          title="Gravimetric residue"
          source="ISO 16232:2018 — gravimetric analysis"
        >
          <Formula>
            {"residue (mg) = filter mass after − filter mass before\n" +
              "per component = residue / k;   per 1000 cm² = residue × 1000 / A   [memory]"}
          </Formula>
          <p>
            The balance must resolve 0.1 mg or better. Without a controlled room climate, residues
            below about {GRAVIMETRY_PRACTICAL_LIMIT_MG} mg are not meaningful: Washproof reports
            such a sample as not qualified (pool more parts on one filter), never as a pass. The
            blank is never subtracted from the residue; it qualifies the result when it is at most
            10 % of it.
          </p>
        </Section>

        <Section
          id="sample-size"
          title="Sample size for pass/fail tests"
          source="Success-run theorem and the binomial distribution, as in published reliability texts"
        >
          <Formula>
            {"no failure allowed:  n = ⌈ ln(1 − C) / ln(R) ⌉\n" +
              "f failures allowed:  the smallest n with  Σ_{k=0..f} C(n,k) (1 − R)^k R^(n−k)  ≤  1 − C"}
          </Formula>
          <p>
            Check values [derived]: C 95 % / R 90 % → 29 parts; 95 / 95 → 59; 95 / 99 → 299. With
            one failure allowed, 95 / 90 → 46.
          </p>
          <SampleSizeCalculator />
        </Section>

        <Section
          id="capability"
          title="Process capability"
          source="NIST/SEMATECH e-Handbook of Statistical Methods — process capability (Cp, CPU, CPL, Cpk)"
        >
          <Formula>
            {"Cp  = (USL − LSL) / 6σ\n" +
              "CPU = (USL − x̄) / 3σ      CPL = (x̄ − LSL) / 3σ\n" +
              "Cpk = min(CPU, CPL)        (one limit only: Cpk is that limit's index)"}
          </Formula>
          <p>
            From individual measurements, Cp and Cpk use the within-process σ = MR̄ / d2 (average
            moving range of two, d2 = {D2_N2}); Pp and Ppk use the overall sample standard deviation
            (n − 1). Worked example [std, Montgomery &amp; Runger, Applied Statistics and
            Probability for Engineers, Ex. 16-3]: specification 100 ± 10, mean 107.0, σ 1.5 → Cp
            2.22, Cpk 0.67. An acceptance threshold such as Cpk ≥ 1.33 is trade practice, not a
            standard, and belongs in the protocol.
          </p>
          <CapabilityCalculator />
        </Section>

        <Section
          id="control-chart"
          title="Individuals and moving-range chart"
          source="ASTM E2587 / NIST e-Handbook — control chart constants for n = 2"
        >
          <Formula>
            {`moving range MR_i = |x_i − x_(i−1)|,   MR̄ = mean of the moving ranges\n` +
              `individuals: centre x̄, limits x̄ ± 3 · MR̄ / d2   (d2 = ${D2_N2})\n` +
              `moving ranges: centre MR̄, upper limit D4 · MR̄   (D4 = ${D4_N2}), lower limit 0`}
          </Formula>
          <p>
            A point is out of control when it lies beyond the limits, when it is the eighth or later
            in a run on one side of the centre line (a value on the centre line breaks the run), or
            when its moving range exceeds the upper limit.
          </p>
        </Section>

        <Section
          id="iso4406"
          title="Bath and rinse-water particle codes"
          source="ISO 4406:2021 — code for the level of contamination by solid particles"
        >
          <Formula>
            {
              "code R4/R6/R14 from particles per mL ≥ 4, ≥ 6 and ≥ 14 µm(c); scale number N covers > 0.01 × 2^(N−1) up to 0.01 × 2^N"
            }
          </Formula>
          <p>
            The bounds are the published rounded ones ({ISO4406_SCALE[13].upperPerMl},{" "}
            {formatNumber(ISO4406_SCALE[17].upperPerMl)},{" "}
            {formatNumber(ISO4406_SCALE[18].upperPerMl)} … particles per mL for scale numbers 13,
            17, 18). Worked example [std]: 3000 / 500 / 7 particles per mL → 19/16/10. The counts
            are cumulative, so they cannot rise with size.
          </p>
        </Section>

        <Section
          id="conductivity"
          title="Conductivity at 25 °C"
          source="Instrument practice, not a standard (linear 2 %/°C); ISO 7888 — factors f25 for natural water (non-linear)"
        >
          <Formula>
            {"linear:      κ25 = κT / (1 + α (T − 25 °C)),   α ≈ 0.02 per °C\n" +
              "non-linear:  κ25 = f25(T) · κT"}
          </Formula>
          <p>
            Check value [derived]: 500 µS/cm at 20 °C with α = 0.02 per °C → 555.6 µS/cm at 25 °C.
            Below about 1 µS/cm the water itself conducts and the linear formula does not hold:
            Washproof warns, and the reading should come from a meter set for pure water.
          </p>
          <ReferenceTable
            caption="ISO 7888 factors held by Washproof"
            head={["Temperature (°C)", "f25 (ratio)", "Source"]}
            rows={ISO7888_F25.map((p) => [String(p.temperatureC), p.f25.toFixed(3), p.source])}
          />
          <p className="text-xs text-stone-600">
            Between these temperatures f25 is interpolated linearly. Outside{" "}
            {ISO7888_F25[0].temperatureC}–{ISO7888_F25[ISO7888_F25.length - 1].temperatureC} °C the
            non-linear compensation is refused rather than extrapolated; use the instrument&apos;s
            own compensation or the linear formula, and say which in the record.
          </p>
        </Section>

        <Section
          id="wetting"
          title="Wetting tension"
          source="ASTM D2578 / ISO 8296 — wetting tension by test mixtures; both are written for plastic film, adapted here to cleaned parts"
        >
          <Formula>
            {
              "result = lowest reading, as measured (1 mN/m = 1 dyn/cm);   pass when result ≥ specified minimum"
            }
          </Formula>
          <p>
            A reading is the test mixture that wets the surface for about 2 s. Washproof reports the
            lowest reading as measured, never rounded up (37.8 mN/m does not meet 38 mN/m), so a
            pass means every spot tested met the minimum, and warns when readings spread by more
            than 1 mN/m, a sign of an unevenly cleaned surface. Minimums such as 38 mN/m before
            painting or bonding are trade practice and come from the customer&apos;s specification.
          </p>
        </Section>
      </div>

      <aside className="mt-12 rounded-lg border border-stone-300 bg-stone-100 px-4 py-3 text-sm text-stone-800">
        <p className="font-semibold">
          A computed result supports judgement; it does not replace it.
        </p>
        <p className="mt-1">
          A computed pass or fail supports, and never replaces, the customer&apos;s specification
          and the responsible engineer&apos;s judgement. Where the customer&apos;s specification or
          the standard says otherwise, they govern.
        </p>
      </aside>
    </>
  );
}

function Section({
  id,
  title,
  source,
  children,
}: {
  id: string;
  title: string;
  source: string;
  children: ReactNode;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="scroll-mt-20">
      <h2 id={`${id}-title`} className="text-lg font-semibold text-stone-900">
        {title}
      </h2>
      <p className="mt-0.5 text-xs uppercase tracking-wide text-stone-500">Source: {source}</p>
      <div className="mt-3 max-w-none space-y-3 text-sm leading-6 text-stone-700">{children}</div>
    </section>
  );
}

function Formula({ children }: { children: string }) {
  return (
    <pre className="overflow-x-auto rounded-md border border-brand-100 bg-brand-50 px-4 py-3 font-mono text-sm leading-6 text-brand-900">
      {children}
    </pre>
  );
}

function Code({ children }: { children: ReactNode }) {
  return (
    <code className="rounded bg-stone-100 px-1 py-0.5 font-mono text-[0.85em] text-stone-900">
      {children}
    </code>
  );
}

function ReferenceTable({
  caption,
  head,
  rows,
}: {
  caption: string;
  head: string[];
  rows: string[][];
}) {
  return (
    <Table density="compact" caption={caption} captionVisible>
      <THead>
        {head.map((h) => (
          <Th key={h}>{h}</Th>
        ))}
      </THead>
      <TBody className="font-mono text-stone-800">
        {rows.map((row) => (
          <tr key={row[0]}>
            {row.map((cell, i) => (
              <Td key={i}>{cell}</Td>
            ))}
          </tr>
        ))}
      </TBody>
    </Table>
  );
}
