import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { AcknowledgeForm, SignOffForm } from "@/components/lab-methods/training-forms";
import { TrainingStateWord } from "@/components/lab-methods/training-state-word";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { todayUtc } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { loadTrainingMatrix, proceduresToAcknowledge } from "@/lib/server/training/queries";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { fromPageParams, readListParams } from "@/lib/url/list-params";
import { REMINDER_DAYS } from "@/lib/training/rules";
import { acknowledgeProcedureAction, signOffTrainingAction } from "./actions";

export const metadata: Metadata = { title: "Training matrix" };

const FILTERS = { procedure: "" };

export default async function TrainingPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("lab.view");
  const today = todayUtc();
  const { procedure: search } = readListParams(fromPageParams(await searchParams), FILTERS);
  const mayAcknowledge = can(user.roles, "training.acknowledge");
  const [{ columns, rows, methods }, toAcknowledge] = await Promise.all([
    loadTrainingMatrix(today),
    mayAcknowledge ? proceduresToAcknowledge(user.id, today, search) : null,
  ]);
  return (
    <>
      <PageHeader
        title="Training matrix"
        description={`Who is trained on which lab method (a trainer's practical sign-off) and which procedure version (the person's signed acknowledgement); a procedure shows here once someone has acknowledged it. "Expires soon" means within ${REMINDER_DAYS} days; the person is reminded by e-mail and in My queue.`}
        actions={
          <IntentLink href="/lab/methods" className="text-sm font-medium text-brand-800 underline">
            Lab methods
          </IntentLink>
        }
      />
      {columns.length === 0 && (
        <p className="mb-3 text-sm text-stone-600">
          No lab method is approved and nobody has acknowledged a procedure yet: each becomes a
          column here once it is.
        </p>
      )}
      {columns.length > 0 && (
        <Table caption="Training matrix" frameClassName="mb-8">
          <THead>
            <Th>Person</Th>
            {columns.map((c) => (
              <Th key={c.key}>
                <span className="block">{c.label}</span>
                <span className="block text-xs font-normal normal-case text-stone-600">
                  {c.kind === "method" ? "Lab method" : "Procedure"}: {c.title}
                </span>
              </Th>
            ))}
          </THead>
          <TBody>
            {rows.length === 0 && (
              <EmptyRow colSpan={columns.length + 1}>Nobody to train yet.</EmptyRow>
            )}
            {rows.map((r) => (
              <tr key={r.person.id}>
                <Th scope="row">{r.person.name}</Th>
                {r.cells.map((cell, i) => (
                  <Td key={columns[i].key}>
                    <TrainingStateWord
                      state={cell.state}
                      expiresOn={cell.expiresOn}
                      subject={columns[i].kind}
                    />
                  </Td>
                ))}
              </tr>
            ))}
          </TBody>
        </Table>
      )}

      <div className="grid gap-8 lg:grid-cols-2">
        {can(user.roles, "training.sign_off") && methods.length > 0 && (
          <section aria-labelledby="sign-off">
            <h2 id="sign-off" className="mb-1 text-lg font-semibold">
              Sign off practical training
            </h2>
            <p className="mb-3 text-sm text-stone-600">
              As the trainer: someone whose own training on the method is current, or an approver or
              administrator. Nobody signs off their own training.
            </p>
            <SignOffForm
              action={signOffTrainingAction}
              people={rows
                .filter((r) => r.person.id !== user.id)
                .map((r) => ({ value: r.person.id, label: r.person.name }))}
              methods={methods.map((m) => ({
                value: m.code,
                label: `${m.code} v${m.version} · ${m.name}`,
              }))}
              today={today}
              signerName={user.name}
            />
          </section>
        )}
        {toAcknowledge && (
          <section aria-labelledby="acknowledge">
            <h2 id="acknowledge" className="mb-1 text-lg font-semibold">
              Acknowledge a procedure
            </h2>
            <p className="mb-3 text-sm text-stone-600">
              Read the version in force under Documents first, then sign for yourself. Listed: the
              procedures in force you have not acknowledged, or whose acknowledgement lapses within{" "}
              {REMINDER_DAYS} days.
            </p>
            {(toAcknowledge.total > toAcknowledge.procedures.length || search !== "") && (
              <ListFilterForm
                label="Find a procedure to acknowledge"
                action="/lab/training#acknowledge"
                filters={[{ name: "procedure", label: "Number or title", value: search }]}
              />
            )}
            <p className="mb-3 text-sm text-stone-600" role="status">
              {acknowledgeStatus(toAcknowledge, search)}
            </p>
            {toAcknowledge.total > 0 && (
              <AcknowledgeForm
                action={acknowledgeProcedureAction}
                procedures={toAcknowledge.procedures.map((p) => ({
                  value: p.versionId,
                  label: `${p.number} v${p.version} · ${p.title}`,
                }))}
                signerName={user.name}
              />
            )}
          </section>
        )}
      </div>
    </>
  );
}

/** What the acknowledge list holds, in words: with a search, how many of the person's match it. */
function acknowledgeStatus(list: { total: number; procedures: unknown[] }, search: string) {
  const total = list.total.toLocaleString("en-GB");
  if (search === "")
    return list.total === 0
      ? "Nothing to acknowledge: your acknowledgement of every procedure in force is current."
      : list.total > list.procedures.length
        ? `${total} to acknowledge; the first ${list.procedures.length} by number are listed. Search to narrow them.`
        : `${total} to acknowledge.`;
  if (list.total === 0)
    return `None of the procedures you have to acknowledge matches “${search}”.`;
  return list.total > list.procedures.length
    ? `${total} of the procedures you have to acknowledge match “${search}”; the first ${list.procedures.length} are listed.`
    : `${total} of the procedures you have to acknowledge match${list.total === 1 ? "es" : ""} “${search}”.`;
}
