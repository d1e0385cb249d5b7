"use client";

import { Upload } from "lucide-react";
import { useRouter } from "next/navigation";
import { useId, useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { EVIDENCE_FILE_KINDS } from "@/db/enums";
import { humanize } from "@/lib/format/labels";

/** Uploads one file at a time through the authorised upload route; the server checks type, size and name. */
export function FileUpload({ runId, maxMb }: { runId: string; maxMb: number }) {
  const router = useRouter();
  const id = useId();
  const [state, setState] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, setPending] = useState(false);
  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setPending(true);
    setState(null);
    try {
      const response = await fetch(`/api/evidence/runs/${runId}/files`, { method: "POST", body: new FormData(form) });
      const body = await response.json().catch(() => ({ ok: false, message: `The upload failed (HTTP ${response.status}).` }));
      setState({ ok: Boolean(body.ok), message: body.message });
      if (body.ok) {
        (form.elements.namedItem("file") as HTMLInputElement).value = "";
        router.refresh();
      }
    } catch {
      setState({ ok: false, message: "The upload did not reach the server. Nothing was stored; try again." });
    } finally {
      setPending(false);
    }
  }
  return (
    <form onSubmit={onSubmit} className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end" aria-label="Upload evidence file">
      <div>
        <label htmlFor={`${id}-file`} className="block text-sm font-medium text-stone-800">
          Evidence file
        </label>
        <input id={`${id}-file`} type="file" name="file" accept=".pdf,.png,.jpg,.jpeg,.csv" required className="mt-1 block w-full text-sm" />
        <p className="mt-1 text-xs text-stone-600">PDF, PNG, JPEG or CSV, up to {maxMb} MB; checked by its contents.</p>
      </div>
      <div>
        <label htmlFor={`${id}-kind`} className="block text-sm font-medium text-stone-800">
          Kind
        </label>
        <select id={`${id}-kind`} name="kind" defaultValue="lab_report" className="mt-1 block w-full rounded-md border border-stone-300 bg-white px-2 py-2 text-sm">
          {EVIDENCE_FILE_KINDS.map((k) => (
            <option key={k} value={k}>
              {humanize(k)}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor={`${id}-sample`} className="block text-sm font-medium text-stone-800">
          Sample (optional)
        </label>
        <input id={`${id}-sample`} name="sampleLabel" className="mt-1 block w-full rounded-md border border-stone-300 px-2 py-2 text-sm" />
      </div>
      <Button type="submit" disabled={pending}>
        <Upload className="h-4 w-4" aria-hidden="true" /> {pending ? "Uploading…" : "Upload"}
      </Button>
      {state && (
        <p role={state.ok ? "status" : "alert"} className={`text-sm sm:col-span-4 ${state.ok ? "text-brand-900" : "text-red-800"}`}>
          {state.message}
        </p>
      )}
    </form>
  );
}
