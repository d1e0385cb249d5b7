"use client";

import Papa from "papaparse";
import { FileSpreadsheet } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { FileField, SelectField } from "@/components/ui/field";
import { autoMapping, CSV_FORMATS, mappingProblems, type ColumnMapping, type CsvTestType, type RowError } from "@/lib/evidence/csv-import";

type Result = { ok: boolean; message: string; rowErrors?: RowError[]; errorCount?: number };

/**
 * CSV import in two steps: the header row is read in the browser and matched to
 * our columns; when names differ, the user maps them. The server reads the whole
 * file again, validates every row, and saves all rows or none.
 */
export function CsvImport({ runId, testType }: { runId: string; testType: CsvTestType }) {
  const format = CSV_FORMATS[testType];
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [headers, setHeaders] = useState<string[]>([]);
  const [mapping, setMapping] = useState<ColumnMapping>({});
  const [result, setResult] = useState<Result | null>(null);
  const [pending, setPending] = useState(false);
  const problems = file ? mappingProblems(mapping, headers, testType) : [];

  function onFile(next: File | null) {
    setFile(next);
    setResult(null);
    setHeaders([]);
    if (!next) return;
    Papa.parse<string[]>(next, {
      preview: 1,
      complete: (r) => {
        const found = (r.data[0] ?? []).map((h) => h.trim()).filter((h) => h !== "");
        setHeaders(found);
        setMapping(autoMapping(found, testType));
      },
    });
  }

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    if (!file) return;
    setPending(true);
    const body = new FormData();
    body.set("file", file);
    body.set("mapping", JSON.stringify(mapping));
    try {
      const response = await fetch(`/api/evidence/runs/${runId}/import`, { method: "POST", body });
      const json: Result & { error?: string } = await response.json().catch(() => ({ ok: false, message: `The import failed (HTTP ${response.status}).` }));
      // A refusal from the route handler carries `error`; the import's own row report carries `message`.
      setResult({ ...json, ok: Boolean(json.ok), message: json.message ?? json.error ?? `The import failed (HTTP ${response.status}).` });
      if (json.ok) router.refresh();
    } catch {
      setResult({ ok: false, message: "The file did not reach the server. Nothing was imported." });
    } finally {
      setPending(false);
    }
  }

  const unmapped = headers.filter((h) => !Object.values(mapping).includes(h));
  const needsMapping = headers.length > 0 && (problems.length > 0 || unmapped.length > 0);
  return (
    <form onSubmit={onSubmit} className="space-y-3 rounded-lg border border-stone-200 bg-white p-4" aria-label={`Import ${format.what} from CSV`}>
      <FileField
        label={`CSV file of ${format.what}`}
        accept=".csv,text/csv"
        onChange={(e) => onFile(e.target.files?.[0] ?? null)}
        hint={
          <>
          One row per sample. Columns:{" "}
          {testType === "particle_cleanliness" ? (
            <>
              <code>sample</code>, <code>basket_position</code>, <code>worst_case</code> (yes/no), <code>components</code>, <code>B</code> … <code>N</code> (absolute counts), <code>largest_metallic_um</code>, <code>largest_non_metallic_um</code>,{" "}
              <code>largest_fibre_um</code>.
            </>
          ) : (
            <>
              <code>sample</code>, <code>basket_position</code>, <code>worst_case</code> (yes/no), <code>components</code> (filtered together), <code>filter_before_mg</code>, <code>filter_after_mg</code>, <code>blank_mg</code>.
            </>
          )}{" "}
          Other names can be mapped below.
          </>
        }
      />
      {needsMapping && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-stone-800">Match the file&apos;s columns</legend>
          <div className="grid gap-2 sm:grid-cols-3 lg:grid-cols-4">
            {format.fields.map((f) => (
              <SelectField
                key={f.key}
                label={f.label}
                dense
                value={mapping[f.key] ?? ""}
                onValueChange={(v) => setMapping((m) => ({ ...m, [f.key]: v || undefined }))}
                placeholder="(not in file)"
                options={headers.map((h) => ({ value: h, label: h }))}
              />
            ))}
          </div>
          {problems.map((p) => (
            <p key={p} className="text-sm text-red-800">
              {p}
            </p>
          ))}
        </fieldset>
      )}
      <Button type="submit" disabled={!file || pending || problems.length > 0}>
        <FileSpreadsheet className="h-4 w-4" aria-hidden="true" /> {pending ? "Importing…" : "Import"}
      </Button>
      {result && (
        <div role={result.ok ? "status" : "alert"} className={`text-sm ${result.ok ? "text-brand-900" : "text-red-800"}`}>
          <p>{result.message}</p>
          {result.rowErrors && result.rowErrors.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {result.rowErrors.map((e, i) => (
                <li key={i}>
                  Line {e.line}: {e.message}
                </li>
              ))}
              {(result.errorCount ?? 0) > result.rowErrors.length && <li>… and {(result.errorCount ?? 0) - result.rowErrors.length} more.</li>}
            </ul>
          )}
        </div>
      )}
    </form>
  );
}
