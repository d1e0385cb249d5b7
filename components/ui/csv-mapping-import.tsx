"use client";

import Papa from "papaparse";
import { FileSpreadsheet } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { FileField, SelectField } from "@/components/ui/field";
import { columnsNeedMatching } from "@/lib/forms/csv-mapping";

type Mapping = Record<string, string | undefined>;
type Result = {
  ok: boolean;
  message: string;
  rowErrors?: { line: number; message: string }[];
  errorCount?: number;
};

export interface CsvMappingImportProps {
  /** The form's accessible name, e.g. "Import part families from CSV". */
  title: string;
  fileLabel: string;
  hint: ReactNode;
  /** Our fields, in the order the mapping grid shows them. */
  fields: readonly { key: string; label: string }[];
  autoMap: (headers: string[]) => Mapping;
  problems: (mapping: Mapping, headers: string[]) => string[];
  /** Where the file, its mapping and `extra` fields are posted; the answer is { ok, message, rowErrors? }. */
  url: string;
  extra?: Record<string, string>;
  /** Controls of the form's own (a recipe's code and name): their named values are posted with the file. */
  children?: ReactNode;
  /** Called with the server's answer after a successful import (to open what was created). */
  onDone?: (result: Record<string, unknown>) => void;
}

/**
 * CSV import in two steps: the header row is read in the browser and matched to our columns; when
 * names differ, the user maps them. The server reads the whole file again, validates every row,
 * and saves all rows or none, answering each problem with its line.
 */
export function CsvMappingImport({
  title,
  fileLabel,
  hint,
  fields,
  autoMap,
  problems: findProblems,
  url,
  extra = {},
  children,
  onDone,
}: CsvMappingImportProps) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [headers, setHeaders] = useState<string[]>([]);
  const [mapping, setMapping] = useState<Mapping>({});
  const [result, setResult] = useState<Result | null>(null);
  const [pending, setPending] = useState(false);
  // Once the file's columns needed matching, the panel stays open for review until the import
  // succeeds or another file is chosen; it used to vanish as the last column was matched.
  const [reviewing, setReviewing] = useState(false);
  const problems = file ? findProblems(mapping, headers) : [];

  function onFile(next: File | null) {
    setFile(next);
    setResult(null);
    setHeaders([]);
    setReviewing(false);
    if (!next) return;
    Papa.parse<string[]>(next, {
      preview: 1,
      complete: (r) => {
        const found = (r.data[0] ?? []).map((h) => h.trim()).filter((h) => h !== "");
        const auto = autoMap(found);
        setHeaders(found);
        setMapping(auto);
        setReviewing(columnsNeedMatching(found, auto, findProblems(auto, found)));
      },
    });
  }

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    if (!file) return;
    setPending(true);
    // The form's own named controls (none on the master-data screen) travel with the file.
    const body = new FormData(event.currentTarget as HTMLFormElement);
    body.set("file", file);
    body.set("mapping", JSON.stringify(mapping));
    for (const [k, v] of Object.entries(extra)) body.set(k, v);
    try {
      const response = await fetch(url, { method: "POST", body });
      const raw: Result & { error?: string } = await response
        .json()
        .catch(() => ({ ok: false, message: `The import failed (HTTP ${response.status}).` }));
      // A refusal from the route handler carries `error`; the import's own row report carries `message`.
      const json: Result = {
        ...raw,
        ok: Boolean(raw.ok),
        message: raw.message ?? raw.error ?? `The import failed (HTTP ${response.status}).`,
      };
      setResult(json);
      if (json.ok) {
        setReviewing(false);
        router.refresh();
        onDone?.(raw as unknown as Record<string, unknown>);
      }
    } catch {
      setResult({ ok: false, message: "The file did not reach the server. Nothing was imported." });
    } finally {
      setPending(false);
    }
  }

  const needsMapping = reviewing || columnsNeedMatching(headers, mapping, problems);
  return (
    <form
      onSubmit={onSubmit}
      className="space-y-3 rounded-lg border border-stone-200 bg-white p-4"
      aria-label={title}
    >
      {children}
      <FileField
        label={fileLabel}
        accept=".csv,text/csv"
        onChange={(e) => onFile(e.target.files?.[0] ?? null)}
        hint={hint}
      />
      {needsMapping && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-stone-800">
            Match the file&apos;s columns
          </legend>
          <div className="grid gap-2 sm:grid-cols-3 lg:grid-cols-4">
            {fields.map((f) => (
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
        <FileSpreadsheet className="h-4 w-4" aria-hidden="true" />{" "}
        {pending ? "Importing…" : "Import"}
      </Button>
      {result && (
        <div
          role={result.ok ? "status" : "alert"}
          className={`text-sm ${result.ok ? "text-brand-900" : "text-red-800"}`}
        >
          <p>{result.message}</p>
          {result.rowErrors && result.rowErrors.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {result.rowErrors.map((e, i) => (
                <li key={i}>
                  Line {e.line}: {e.message}
                </li>
              ))}
              {(result.errorCount ?? 0) > result.rowErrors.length && (
                <li>… and {(result.errorCount ?? 0) - result.rowErrors.length} more.</li>
              )}
            </ul>
          )}
        </div>
      )}
    </form>
  );
}
