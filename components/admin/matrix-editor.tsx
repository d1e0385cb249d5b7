"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField, SelectField } from "@/components/ui/field";
import { AddRowButton, PayloadField, RemoveRowButton, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import { TEST_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { DEFAULT_MIN_CYCLES, samplesFor, type MatrixRow } from "@/lib/changes/requalification";
import { MATRIX_SUBJECTS, subjectLabel, TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

type Draft = {
  subject: string;
  testType: string;
  confidencePct: string;
  reliabilityPct: string;
  minCycles: string;
};

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
      minCycles: String(r.minCycles ?? DEFAULT_MIN_CYCLES),
    })),
  );
  const [note, setNote] = useState("");
  return (
    <ActionForm action={action} className="space-y-4" aria-label="Requalification matrix">
      <PayloadField value={{ note, rows: list.values }} />
      <Table caption="Matrix rows">
        <THead>
          <Th>When this changes (major)</Th>
          <Th>Test</Th>
          <Th>Confidence (%)</Th>
          <Th>Reliability (%)</Th>
          <Th>Samples</Th>
          <Th>From at least (cycles)</Th>
          <Th>
            <span className="sr-only">Remove</span>
          </Th>
        </THead>
        <TBody className="align-top">
          {list.rows.map(({ key, value: d }, i) => (
            <tr key={key}>
              <Td className="[--cell-py:0.375rem]">
                <SelectField
                  label={`Subject of row ${i + 1}`}
                  hideLabel
                  dense
                  errorKey={`rows.${i}.subject`}
                  value={d.subject}
                  onValueChange={(v) => list.update(i, { subject: v })}
                  options={SUBJECT_OPTIONS}
                />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <SelectField
                  label={`Test of row ${i + 1}`}
                  hideLabel
                  dense
                  errorKey={`rows.${i}.testType`}
                  value={d.testType}
                  onValueChange={(v) => list.update(i, { testType: v })}
                  options={TEST_OPTIONS}
                />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <NumberField
                  label={`Confidence of row ${i + 1}`}
                  hideLabel
                  dense
                  errorKey={`rows.${i}.confidencePct`}
                  value={d.confidencePct}
                  onValueChange={(v) => list.update(i, { confidencePct: v })}
                />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <NumberField
                  label={`Reliability of row ${i + 1}`}
                  hideLabel
                  dense
                  errorKey={`rows.${i}.reliabilityPct`}
                  value={d.reliabilityPct}
                  onValueChange={(v) => list.update(i, { reliabilityPct: v })}
                />
              </Td>
              <Td className="tabular-nums">{preview(d)}</Td>
              <Td className="[--cell-py:0.375rem]">
                <NumberField
                  label={`Distinct cycles of row ${i + 1}`}
                  hideLabel
                  dense
                  integer
                  errorKey={`rows.${i}.minCycles`}
                  value={d.minCycles}
                  onValueChange={(v) => list.update(i, { minCycles: v })}
                />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <RemoveRowButton label={`Remove row ${i + 1}`} onRemove={() => list.remove(i)} />
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <AddRowButton
        onAdd={() =>
          list.add({
            subject: MATRIX_SUBJECTS[0],
            testType: TEST_TYPES[0],
            confidencePct: "95",
            reliabilityPct: "90",
            minCycles: String(DEFAULT_MIN_CYCLES),
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
