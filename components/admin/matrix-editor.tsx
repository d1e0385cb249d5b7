"use client";

import { Plus, Trash2 } from "lucide-react";
import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { FieldError } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { SubmitButton } from "@/components/ui/submit-button";
import { TEST_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { samplesFor, type MatrixRow } from "@/lib/changes/requalification";
import { MATRIX_SUBJECTS, subjectLabel, TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

type Draft = { uid: number; subject: string; testType: string; confidencePct: string; reliabilityPct: string };
let n = 0;

function preview(r: Draft) {
  const c = Number(r.confidencePct);
  const rel = Number(r.reliabilityPct);
  return c > 50 && c < 100 && rel > 50 && rel < 100 ? `${samplesFor({ confidencePct: c, reliabilityPct: rel })} parts` : "—";
}

/** The requalification matrix as an editable table; saving makes a new version. */
export function MatrixEditor({ action, rows }: { action: (prev: FormState, formData: FormData) => Promise<FormState>; rows: MatrixRow[] }) {
  const [drafts, setDrafts] = useState<Draft[]>(() => rows.map((r) => ({ uid: ++n, subject: r.subject, testType: r.testType, confidencePct: String(r.confidencePct), reliabilityPct: String(r.reliabilityPct) })));
  const [note, setNote] = useState("");
  const set = (i: number, patch: Partial<Draft>) => setDrafts((all) => all.map((d, j) => (j === i ? { ...d, ...patch } : d)));
  const payload = { note, rows: drafts.map(({ uid: _u, ...d }) => d) };
  return (
    <ActionForm action={action} className="space-y-4" aria-label="Requalification matrix">
      <input type="hidden" name="payload" value={JSON.stringify(payload)} />
      <Table caption="Matrix rows">
        <THead>
          <Th>When this changes (major)</Th>
          <Th>Test</Th>
          <Th>Confidence (%)</Th>
          <Th>Reliability (%)</Th>
          <Th>Samples</Th>
          <Th>
            <span className="sr-only">Remove</span>
          </Th>
        </THead>
        <TBody>
          {drafts.map((d, i) => (
            <tr key={d.uid}>
              <Td className="[--cell-py:0.375rem]">
                <select aria-label={`Subject of row ${i + 1}`} value={d.subject} onChange={(e) => set(i, { subject: e.target.value })} className="rounded-md border border-stone-300 px-2 py-1">
                  {MATRIX_SUBJECTS.map((s) => (
                    <option key={s} value={s}>
                      {subjectLabel(s)}
                    </option>
                  ))}
                </select>
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <select aria-label={`Test of row ${i + 1}`} value={d.testType} onChange={(e) => set(i, { testType: e.target.value })} className="rounded-md border border-stone-300 px-2 py-1">
                  {TEST_TYPES.map((t) => (
                    <option key={t} value={t}>
                      {TEST_TYPE_LABELS[t]}
                    </option>
                  ))}
                </select>
                <FieldError name={`rows.${i}.testType`} />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <input aria-label={`Confidence of row ${i + 1}`} value={d.confidencePct} onChange={(e) => set(i, { confidencePct: e.target.value })} inputMode="decimal" className="w-20 rounded-md border border-stone-300 px-2 py-1" />
                <FieldError name={`rows.${i}.confidencePct`} />
              </Td>
              <Td className="[--cell-py:0.375rem]">
                <input aria-label={`Reliability of row ${i + 1}`} value={d.reliabilityPct} onChange={(e) => set(i, { reliabilityPct: e.target.value })} inputMode="decimal" className="w-20 rounded-md border border-stone-300 px-2 py-1" />
                <FieldError name={`rows.${i}.reliabilityPct`} />
              </Td>
              <Td className="tabular-nums [--cell-py:0.375rem]">{preview(d)}</Td>
              <Td className="[--cell-py:0.375rem]">
                <Button variant="ghost" aria-label={`Remove row ${i + 1}`} onClick={() => setDrafts((all) => all.filter((_, j) => j !== i))}>
                  <Trash2 className="h-4 w-4" aria-hidden="true" />
                </Button>
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <Button variant="secondary" onClick={() => setDrafts((all) => [...all, { uid: ++n, subject: MATRIX_SUBJECTS[0], testType: TEST_TYPES[0], confidencePct: "95", reliabilityPct: "90" }])}>
        <Plus className="h-4 w-4" aria-hidden="true" /> Add row
      </Button>
      <label className="block max-w-xl text-sm">
        <span className="font-medium">What changed and why</span>
        <input value={note} onChange={(e) => setNote(e.target.value)} className="mt-1 block w-full rounded-md border border-stone-300 px-3 py-2" />
        <FieldError name="note" />
      </label>
      <SubmitButton>Save as new version</SubmitButton>
    </ActionForm>
  );
}

