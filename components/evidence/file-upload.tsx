"use client";

import { Upload } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field, FileField, SelectField } from "@/components/ui/field";
import { EVIDENCE_FILE_KINDS } from "@/db/enums";
import { humanize } from "@/lib/format/labels";

/** Uploads one file at a time through the authorised upload route; the server checks type, size and name. */
export function FileUpload({ runId, maxMb }: { runId: string; maxMb: number }) {
  const router = useRouter();
  const [state, setState] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, setPending] = useState(false);
  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setPending(true);
    setState(null);
    try {
      const response = await fetch(`/api/evidence/runs/${runId}/files`, {
        method: "POST",
        body: new FormData(form),
      });
      const body = await response
        .json()
        .catch(() => ({ ok: false, message: `The upload failed (HTTP ${response.status}).` }));
      // A refusal carries `error` (every route handler's error shape); a success its `message`.
      setState({
        ok: Boolean(body.ok),
        message: body.ok ? body.message : (body.error ?? body.message),
      });
      if (body.ok) {
        (form.elements.namedItem("file") as HTMLInputElement).value = "";
        // The next file is usually another sample's: a carried-over label would tag it to the wrong one.
        (form.elements.namedItem("sampleLabel") as HTMLInputElement).value = "";
        router.refresh();
      }
    } catch {
      setState({
        ok: false,
        message: "The upload did not reach the server. Nothing was stored; try again.",
      });
    } finally {
      setPending(false);
    }
  }
  return (
    <form
      onSubmit={onSubmit}
      className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end"
      aria-label="Upload evidence file"
    >
      <FileField
        name="file"
        label="Evidence file"
        accept=".pdf,.png,.jpg,.jpeg,.csv"
        required
        hint={`PDF, PNG, JPEG or CSV, up to ${maxMb} MB; checked by its contents.`}
      />
      <SelectField
        name="kind"
        label="Kind"
        defaultValue="lab_report"
        options={EVIDENCE_FILE_KINDS.map((k) => ({ value: k, label: humanize(k) }))}
      />
      <Field name="sampleLabel" label="Sample (optional)" />
      <Button type="submit" disabled={pending}>
        <Upload className="h-4 w-4" aria-hidden="true" /> {pending ? "Uploading…" : "Upload"}
      </Button>
      {state && (
        <p
          role={state.ok ? "status" : "alert"}
          className={`text-sm sm:col-span-4 ${state.ok ? "text-brand-900" : "text-red-800"}`}
        >
          {state.message}
        </p>
      )}
    </form>
  );
}
