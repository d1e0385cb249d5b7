"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FileField } from "@/components/ui/field";

/** The part family's picture, and for those who manage part families an upload that replaces it. */
export function FamilyPicture({
  familyId,
  familyName,
  version,
  canUpload,
}: {
  familyId: string;
  familyName: string;
  /** The stored file's hash, so a new picture is fetched rather than the cached one. */
  version: string | null;
  canUpload: boolean;
}) {
  const router = useRouter();
  const [status, setStatus] = useState<{ error: boolean; text: string } | null>(null);

  async function upload(file: File | null) {
    setStatus(null);
    if (!file) return;
    setStatus({ error: false, text: `Uploading ${file.name}…` });
    const body = new FormData();
    body.set("file", file);
    try {
      const response = await fetch(`/api/parts/families/${familyId}/picture`, {
        method: "POST",
        body,
      });
      const json = (await response.json().catch(() => null)) as {
        ok?: boolean;
        message?: string;
        error?: string;
      } | null;
      if (!response.ok || !json?.ok) {
        setStatus({
          error: true,
          text: json?.error ?? json?.message ?? `The upload failed (HTTP ${response.status}).`,
        });
        return;
      }
      setStatus({ error: false, text: json.message ?? "Picture saved." });
      router.refresh();
    } catch {
      setStatus({ error: true, text: "The file did not reach the server." });
    }
  }

  return (
    <section aria-labelledby="picture" className="mb-6 max-w-xl space-y-2">
      <h2 id="picture" className="text-lg font-semibold">
        Picture
      </h2>
      {version ? (
        // A plain img: the picture is served by our own route with its session, not optimised.
        // eslint-disable-next-line @next/next/no-img-element
        <img
          src={`/api/parts/families/${familyId}/picture?v=${version.slice(0, 16)}`}
          alt={`Picture of ${familyName}`}
          className="max-h-72 rounded-md border border-stone-200 bg-white object-contain"
        />
      ) : (
        <p className="text-sm text-stone-600">No picture yet.</p>
      )}
      {canUpload && (
        <FileField
          label={version ? "Replace the picture" : "Upload a picture"}
          accept="image/png,image/jpeg"
          onChange={(e) => void upload(e.target.files?.[0] ?? null)}
          hint="PNG or JPEG, up to 5 MB; the change is kept in the audit trail."
        />
      )}
      {status && (
        <p
          role={status.error ? "alert" : "status"}
          className={`text-sm ${status.error ? "text-red-800" : "text-stone-700"}`}
        >
          {status.text}
        </p>
      )}
    </section>
  );
}
