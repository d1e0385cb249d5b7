"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField, SelectField } from "@/components/ui/field";
import { AddRowButton, PayloadField, RemoveRowButton, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import { TEST_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { samplesFor, type MatrixRow } from "@/lib/recipes/requalification";
import { MATRIX_SUBJECTS, subjectLabel, TEST_TYPE_LABELS } from "@/lib/recipes/test-types";

type Draft = { subject: string; testType: string; confidencePct: string; reliabilityPct: string };

const SUBJECT_OPTIONS = MATRIX_SUBJECTS.map((s) => ({ value: s, label: subjectLabel(s) }));
const TEST_OPTIONS = TEST_TYPES.map((t) => ({ value: t, label: TEST_TYPE_LABELS[t] }));

function preview(r: Draft) {
  const c = Number(r.confidencePct);
  const rel = Number(r.reliabilityPct);
  return c > 50 && c < 100 && rel > 50 && rel < 100
    ? `${samplesFor({ confidencePct: c, reliabilityPct: rel })} parts`
    : "—";
}

/** The requalification matrix as an editable table; saving makes a new version. */
export function MatrixEditor({
  action,
  rows,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  rows: MatrixRow[];
}) {
  const list = useRowList<Draft>(() =>
    rows.map((r) => ({
      subject: r.subject,
      testType: r.testType,
      confidencePct: String(r.confidencePct),
      reliabilityPct: String(r.reliabilityPct),
    })),
  );
  const [note, setNote] = useState("");
  return (
    <ActionForm action={action} className="space-y-4" aria-label="Requalification matrix">
      <PayloadField value={{ note, rows: list.values }} />
      <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
        <table className="w-full text-sm">
          <caption className="sr-only">Matrix rows</caption>
          <thead className="bg-stone-50 text-left text-xs text-stone-500 uppercase">
            <tr>
              <th className="px-3 py-2 font-medium">When this changes (major)</th>
              <th className="px-3 py-2 font-medium">Test</th>
              <th className="px-3 py-2 font-medium">Confidence (%)</th>
              <th className="px-3 py-2 font-medium">Reliability (%)</th>
              <th className="px-3 py-2 font-medium">Samples</th>
              <th className="px-3 py-2 font-medium">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-stone-100 align-top">
            {list.rows.map(({ key, value: d }, i) => (
              <tr key={key}>
                <td className="px-3 py-1.5">
                  <SelectField
                    label={`Subject of row ${i + 1}`}
                    hideLabel
                    dense
                    errorKey={`rows.${i}.subject`}
                    value={d.subject}
                    onValueChange={(v) => list.update(i, { subject: v })}
                    options={SUBJECT_OPTIONS}
                  />
                </td>
                <td className="px-3 py-1.5">
                  <SelectField
                    label={`Test of row ${i + 1}`}
                    hideLabel
                    dense
                    errorKey={`rows.${i}.testType`}
                    value={d.testType}
                    onValueChange={(v) => list.update(i, { testType: v })}
                    options={TEST_OPTIONS}
                  />
                </td>
                <td className="px-3 py-1.5">
                  <NumberField
                    label={`Confidence of row ${i + 1}`}
                    hideLabel
                    dense
                    errorKey={`rows.${i}.confidencePct`}
                    value={d.confidencePct}
                    onValueChange={(v) => list.update(i, { confidencePct: v })}
                  />
                </td>
                <td className="px-3 py-1.5">
                  <NumberField
                    label={`Reliability of row ${i + 1}`}
                    hideLabel
                    dense
                    errorKey={`rows.${i}.reliabilityPct`}
                    value={d.reliabilityPct}
                    onValueChange={(v) => list.update(i, { reliabilityPct: v })}
                  />
                </td>
                <td className="px-3 py-2 tabular-nums">{preview(d)}</td>
                <td className="px-3 py-1.5">
                  <RemoveRowButton label={`Remove row ${i + 1}`} onRemove={() => list.remove(i)} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <AddRowButton
        onAdd={() =>
          list.add({
            subject: MATRIX_SUBJECTS[0],
            testType: TEST_TYPES[0],
            confidencePct: "95",
            reliabilityPct: "90",
          })
        }
      >
        Add row
      </AddRowButton>
      <Field
        label="What changed and why"
        errorKey="note"
        value={note}
        onValueChange={setNote}
        className="max-w-xl"
      />
      <SubmitButton>Save as new version</SubmitButton>
    </ActionForm>
  );
}
