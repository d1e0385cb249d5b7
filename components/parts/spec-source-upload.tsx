"use client";

import { useState } from "react";
import { FileField } from "@/components/ui/field";

type Stored = { id: string; name: string; sha256: string };

/**
 * Uploads the customer's source document as soon as it is chosen and keeps its stored id in the
 * form, so the register row cites exactly the file the limits were typed from.
 */
export function SpecSourceUpload({ current }: { current?: { id: string; name: string } | null }) {
  const [stored, setStored] = useState<
    Stored | { id: string; name: string; sha256?: undefined } | null
  >(current ?? null);
  const [status, setStatus] = useState<{ error: boolean; text: string } | null>(null);

  async function upload(file: File | null) {
    setStatus(null);
    if (!file) return;
    setStatus({ error: false, text: `Uploading ${file.name}…` });
    const body = new FormData();
    body.set("file", file);
    try {
      const response = await fetch("/api/parts/specs/source", { method: "POST", body });
      const json = (await response.json().catch(() => null)) as {
        ok?: boolean;
        message?: string;
        file?: Stored;
      } | null;
      if (!response.ok || !json?.ok || !json.file) {
        setStatus({
          error: true,
          text: json?.message ?? `The upload failed (HTTP ${response.status}).`,
        });
        return;
      }
      setStored(json.file);
      setStatus({ error: false, text: json.message ?? "Stored." });
    } catch {
      setStatus({ error: true, text: "The file did not reach the server." });
    }
  }

  return (
    <div className="space-y-1 sm:col-span-2">
      <input type="hidden" name="sourceFileId" value={stored?.id ?? ""} />
      <FileField
        label="Source document (optional)"
        errorKey="sourceFileId"
        accept=".pdf,.png,.jpg,.jpeg,.csv"
        onChange={(e) => void upload(e.target.files?.[0] ?? null)}
        hint={
          stored
            ? `Stored: ${stored.name}${stored.sha256 ? ` (SHA-256 ${stored.sha256.slice(0, 12)}…)` : ""}.`
            : "The customer's specification as issued; kept by its SHA-256 hash."
        }
      />
      {status && (
        <p
          role={status.error ? "alert" : "status"}
          className={`text-sm ${status.error ? "text-red-800" : "text-stone-700"}`}
        >
          {status.text}
        </p>
      )}
    </div>
  );
}
