"use client";

import { EditorContent, useEditor } from "@tiptap/react";
import StarterKit from "@tiptap/starter-kit";
import { Bold, Italic, List, ListOrdered } from "lucide-react";
import { useState, type ReactNode } from "react";
import type { RichDoc } from "@/lib/documents/rich-text";

export interface RootCauseEditorProps {
  initialContent: RichDoc | null;
  /** The hidden field the form submits: the editor's JSON. */
  name: string;
}

function Tool(props: { label: string; active: boolean; onClick: () => void; children: ReactNode }) {
  return (
    <button
      type="button"
      aria-label={props.label}
      title={props.label}
      aria-pressed={props.active}
      onClick={props.onClick}
      className="rounded p-1.5 text-stone-700 hover:bg-stone-100 aria-pressed:bg-brand-100 aria-pressed:text-brand-900"
    >
      {props.children}
    </button>
  );
}

/**
 * Rich text for a root cause (the five whys as a numbered list, say), as documents use it:
 * the form sends Tiptap's JSON and the server validates and cleans it like document content.
 */
export default function RootCauseEditor({ initialContent, name }: RootCauseEditorProps) {
  const [json, setJson] = useState(() => (initialContent ? JSON.stringify(initialContent) : ""));
  const editor = useEditor({
    immediatelyRender: false,
    extensions: [StarterKit.configure({ heading: false, link: false, codeBlock: false })],
    content: initialContent ?? "",
    editorProps: {
      attributes: {
        role: "textbox",
        "aria-multiline": "true",
        "aria-label": "Root cause",
        class: "prose prose-sm max-w-none min-h-32 px-3 py-2 focus:outline-none",
      },
    },
    onUpdate: ({ editor }) => setJson(editor.isEmpty ? "" : JSON.stringify(editor.getJSON())),
  });
  const icon = "h-4 w-4";
  return (
    <div className="rounded-md border border-stone-300 bg-white">
      <input type="hidden" name={name} value={json} />
      {editor && (
        <div
          className="flex gap-1 border-b border-stone-200 px-2 py-1"
          role="toolbar"
          aria-label="Formatting"
        >
          <Tool
            label="Bold"
            active={editor.isActive("bold")}
            onClick={() => editor.chain().focus().toggleBold().run()}
          >
            <Bold className={icon} aria-hidden="true" />
          </Tool>
          <Tool
            label="Italic"
            active={editor.isActive("italic")}
            onClick={() => editor.chain().focus().toggleItalic().run()}
          >
            <Italic className={icon} aria-hidden="true" />
          </Tool>
          <Tool
            label="Bulleted list"
            active={editor.isActive("bulletList")}
            onClick={() => editor.chain().focus().toggleBulletList().run()}
          >
            <List className={icon} aria-hidden="true" />
          </Tool>
          <Tool
            label="Numbered list"
            active={editor.isActive("orderedList")}
            onClick={() => editor.chain().focus().toggleOrderedList().run()}
          >
            <ListOrdered className={icon} aria-hidden="true" />
          </Tool>
        </div>
      )}
      <EditorContent editor={editor} />
    </div>
  );
}
