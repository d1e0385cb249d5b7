import type { ChangeSubject } from "@/lib/changes/subjects";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { LIMIT_TESTS } from "@/lib/changes/subjects";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { ImpactWord } from "./diff-view";

const DIRECTION = {
  tightened: "Tightened",
  loosened: "Loosened",
  both: "Tighter and looser",
  changed: "Reworded",
} as const;

/** What an equipment or specification change changes besides the recipe, old → new, with its class. */
export function SubjectView({ subject }: { subject: ChangeSubject }) {
  if (subject.kind === "equipment")
    return (
      <div className="space-y-2">
        <Table caption={`Equipment diff, ${subject.system}`} captionVisible>
          <THead>
            <Th>Stage</Th>
            <Th>Old → new</Th>
            <Th>Class</Th>
          </THead>
          <TBody>
            {subject.changes.map((c, i) => (
              <tr key={i}>
                <Td>{c.stage}</Td>
                <Td>{c.reason}</Td>
                <Td>
                  <ImpactWord impact={c.impact} />
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
        <p className="text-sm text-stone-600">
          The washer keeps its equipment until this change request closes; closing it writes the new
          equipment.
          {subject.alsoRuns.length > 0 &&
            ` The same washer also runs ${subject.alsoRuns.join(", ")}: consider their requalification in the risk assessment.`}
        </p>
      </div>
    );
  return (
    <Table
      caption={`Specification limits, ${subject.spec} rev ${subject.fromRevision} → rev ${subject.toRevision}`}
      captionVisible
    >
      <THead>
        <Th>Limit old → new</Th>
        <Th>Direction</Th>
        <Th>Proven by</Th>
      </THead>
      <TBody>
        {subject.changes.map((c) => (
          <tr key={c.field}>
            <Td>{c.reason}</Td>
            <Td>{DIRECTION[c.direction]}</Td>
            <Td>
              {LIMIT_TESTS[c.field]
                ? TEST_TYPE_LABELS[LIMIT_TESTS[c.field]!]
                : "judged by a person"}
            </Td>
          </tr>
        ))}
      </TBody>
    </Table>
  );
}
