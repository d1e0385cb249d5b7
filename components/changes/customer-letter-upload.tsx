"use client";

import { useState } from "react";
import { FileField } from "@/components/ui/field";

type Stored = { id: string; name: string; sha256: string };

/**
 * Uploads the customer's letter as soon as it is chosen and keeps its stored id in the form,
 * so the decision cites exactly the letter received.
 */
export function CustomerLetterUpload({ label }: { label: string }) {
  const [stored, setStored] = useState<Stored | null>(null);
  const [status, setStatus] = useState<{ error: boolean; text: string } | null>(null);

  async function upload(file: File | null) {
    setStatus(null);
    if (!file) return;
    setStatus({ error: false, text: `Uploading ${file.name}…` });
    const body = new FormData();
    body.set("file", file);
    try {
      const response = await fetch("/api/changes/customer-letter", { method: "POST", body });
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
    <div className="space-y-1">
      <input type="hidden" name="letterFileId" value={stored?.id ?? ""} />
      <FileField
        label={label}
        errorKey="letterFileId"
        accept=".pdf,.png,.jpg,.jpeg"
        onChange={(e) => void upload(e.target.files?.[0] ?? null)}
        hint={
          stored
            ? `Stored: ${stored.name} (SHA-256 ${stored.sha256.slice(0, 12)}…).`
            : "The customer's letter or e-mail as a PDF or image; kept by its SHA-256 hash."
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
