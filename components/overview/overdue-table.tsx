import { IntentLink } from "@/components/ui/intent-link";
import { Table, TBody, Td, Th, THead, EmptyRow } from "@/components/ui/table";
import { formatDate } from "@/lib/format/date";
import { OVERDUE_SOURCE_LABELS, overdueStateLabel, type OverdueTest } from "@/lib/overview/overdue";
import { CellState } from "./state-word";

/** Rows shown: overdue first, so the oldest are always on the page; the rest are counted. */
export const OVERDUE_ROWS_SHOWN = 50;

/** Plant-wide tests and checks past their date or due soon, overdue first. */
export function OverdueTable({
  items,
  counts,
  now = new Date(),
}: {
  items: OverdueTest[];
  counts: Record<OverdueTest["state"], number>;
  now?: Date;
}) {
  return (
    <section id="overdue-tests" aria-labelledby="overdue-title" className="mt-8 scroll-mt-4">
      <h2 id="overdue-title" className="text-lg font-semibold text-stone-900">
        Overdue tests
      </h2>
      <p className="mb-2 text-sm text-stone-600">
        {counts.overdue} overdue, {counts.due} due now or soon: periodic requalifications, equipment
        checks, bath readings whose interval has run out, and the routine tests of control plans.
      </p>
      <Table caption="Overdue and due tests and checks">
        <THead>
          <Th>State</Th>
          <Th>Due</Th>
          <Th>What</Th>
          <Th>Where</Th>
          <Th>Kind</Th>
        </THead>
        <TBody>
          {items.length === 0 && <EmptyRow colSpan={5}>Nothing overdue or due soon.</EmptyRow>}
          {items.slice(0, OVERDUE_ROWS_SHOWN).map((i) => (
            <tr key={`${i.source}-${i.href}-${i.characteristic}-${i.subject}`}>
              <Td>
                <CellState level={i.state === "overdue" ? "bad" : "warn"}>
                  {overdueStateLabel(i, now)}
                </CellState>
              </Td>
              <Td>{formatDate(i.dueAt)}</Td>
              <Td>
                <IntentLink
                  href={i.href}
                  className="text-brand-800 underline-offset-2 hover:underline"
                >
                  {i.characteristic}
                </IntentLink>
              </Td>
              <Td>{i.subject}</Td>
              <Td>{OVERDUE_SOURCE_LABELS[i.source]}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
      {items.length > OVERDUE_ROWS_SHOWN && (
        <p className="mt-2 text-sm text-stone-600">
          Showing the first {OVERDUE_ROWS_SHOWN} of {items.length}; each washer&apos;s checks and
          its bath log list the rest.
        </p>
      )}
    </section>
  );
}
