"use client";

import { useEffect, useRef, useState } from "react";
import { FileField } from "@/components/ui/field";

/**
 * Uploads a file to its route as soon as it is chosen and keeps the stored file's id in a hidden
 * field, so the form saved afterwards cites exactly those bytes.
 */
export function StoredFileUpload({
  endpoint,
  name,
  label,
  accept,
  hint,
  what,
}: {
  endpoint: string;
  /** The hidden field the form's action reads the file id from. */
  name: string;
  label: string;
  accept: string;
  hint: string;
  /** "photo", "certificate": in the message when the upload fails. */
  what: string;
}) {
  const [stored, setStored] = useState<{ id: string; name: string } | null>(null);
  const [status, setStatus] = useState<{ error: boolean; text: string } | null>(null);
  // When the form is reset after a save, the stored file goes with it: a second record saved
  // without choosing a file must not cite the first one's.
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const form = box.current?.closest("form");
    if (!form) return;
    const forget = () => {
      setStored(null);
      setStatus(null);
    };
    form.addEventListener("reset", forget);
    return () => form.removeEventListener("reset", forget);
  }, []);
  async function upload(file: File | null) {
    setStatus(null);
    setStored(null);
    if (!file) return;
    setStatus({ error: false, text: `Uploading ${file.name}…` });
    const body = new FormData();
    body.set("file", file);
    try {
      const response = await fetch(endpoint, { method: "POST", body });
      const json = (await response.json().catch(() => null)) as {
        ok?: boolean;
        message?: string;
        error?: string;
        file?: { id: string; name: string };
      } | null;
      if (!response.ok || !json?.ok || !json.file) {
        setStatus({
          error: true,
          text: json?.error ?? json?.message ?? `The upload failed (HTTP ${response.status}).`,
        });
        return;
      }
      setStored(json.file);
      setStatus({ error: false, text: json.message ?? "Stored." });
    } catch {
      setStatus({ error: true, text: `The ${what} did not reach the server.` });
    }
  }
  return (
    <div ref={box} className="space-y-1">
      <input type="hidden" name={name} value={stored?.id ?? ""} />
      <FileField
        label={label}
        errorKey={name}
        accept={accept}
        onChange={(e) => void upload(e.target.files?.[0] ?? null)}
        hint={hint}
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
