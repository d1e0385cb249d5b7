"use client";

import dynamic from "next/dynamic";
import type { DocumentEditorProps } from "./document-editor";

/** The editor is a heavy client-only leaf: loaded after the page, never rendered on the server. */
const DocumentEditor = dynamic(() => import("./document-editor"), {
  ssr: false,
  loading: () => (
    <p className="rounded-lg border border-stone-200 bg-white px-6 py-4 text-sm text-stone-600">
      Loading the editor…
    </p>
  ),
});

export function DocumentEditorLoader(props: DocumentEditorProps) {
  return <DocumentEditor {...props} />;
}
