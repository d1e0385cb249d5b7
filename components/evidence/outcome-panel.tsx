import type { ReactNode } from "react";
import { checkWord, type Check } from "@/lib/evidence/outcomes/common";
import type { RunOutcome } from "@/lib/evidence/outcome";
import { OutcomeWord } from "./status-word";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

function CheckWord({ check }: { check: Check }) {
  const word = checkWord(check);
  if (word === "not recorded")
    return <span className="font-normal text-stone-600">Not recorded</span>;
  return <OutcomeWord outcome={word} />;
}

/** The computed outcome with its working: every line says what was compared with what. */
/** `outcome.samples` may be one page of them; `pager` then moves between the pages. */
export function OutcomePanel({ outcome, pager }: { outcome: RunOutcome; pager?: ReactNode }) {
  return (
    <section
      aria-labelledby="outcome-title"
      className="rounded-lg border border-stone-200 bg-white p-5"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 id="outcome-title" className="text-lg font-semibold">
          Computed outcome: <OutcomeWord outcome={outcome.outcome} />
        </h2>
        {outcome.code && (
          <p className="text-sm">
            Run cleanliness code ({outcome.basisUnit}):{" "}
            <span className="font-mono font-medium" data-testid="run-ccc">
              {outcome.code}
            </span>
          </p>
        )}
      </div>
      <p className="mt-1 text-xs text-stone-600">
        Computed from the stored raw data, never typed. It supports, and never replaces, the
        customer&apos;s specification and the responsible engineer&apos;s judgement.
      </p>
      {outcome.missing.length > 0 && (
        <ul className="mt-3 list-disc pl-5 text-sm text-stone-800">
          {outcome.missing.map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
      {outcome.checks.map((c) => (
        <div key={c.title} className="mt-4">
          <h3 className="flex gap-2 text-sm font-semibold">
            {c.title}: <CheckWord check={c} />
          </h3>
          <ul className="mt-1 space-y-0.5 font-mono text-xs text-stone-700">
            {c.lines.map((l, i) => (
              <li key={i}>{l}</li>
            ))}
          </ul>
        </div>
      ))}
      {pager && <div className="mt-4">{pager}</div>}
      {outcome.samples.length > 0 && (
        <Table density="compact" caption="Samples" captionVisible frameClassName="mt-4">
          <THead>
            <Th>Sample</Th>
            <Th>Outcome</Th>
            <Th>Working</Th>
          </THead>
          <TBody className="align-top">
            {outcome.samples.map((s) => (
              <tr key={s.sampleLabel}>
                <Td className="font-medium whitespace-nowrap">
                  {s.sampleLabel}
                  {s.worstCase && (
                    <span className="block text-xs font-normal text-stone-600">
                      worst-case position
                    </span>
                  )}
                  {s.code && <span className="block font-mono text-xs font-normal">{s.code}</span>}
                </Td>
                <Td className="whitespace-nowrap">
                  <OutcomeWord outcome={s.outcome} />
                </Td>
                <Td>
                  <ul className="space-y-0.5 font-mono text-xs text-stone-700">
                    {s.lines.map((l, i) => (
                      <li key={i}>{l}</li>
                    ))}
                  </ul>
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
    </section>
  );
}
