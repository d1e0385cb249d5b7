"use client";

import { TableKit } from "@tiptap/extension-table";
import { EditorContent, useEditor, type Editor } from "@tiptap/react";
import StarterKit from "@tiptap/starter-kit";
import {
  Bold,
  Columns3,
  Heading2,
  Heading3,
  Italic,
  Link2,
  List,
  ListOrdered,
  Redo2,
  Rows3,
  Table,
  Undo2,
} from "lucide-react";
import { useCallback, useEffect, useRef, useState, type ReactNode } from "react";
import { saveDraftAction } from "@/app/(app)/documents/actions";
import { Button } from "@/components/ui/button";
import { isSafeHref, type RichDoc } from "@/lib/documents/rich-text";

export interface DocumentEditorProps {
  versionId: string;
  initialContent: RichDoc;
  initialLockVersion: number;
}

type SaveState =
  | { kind: "saved"; at: string | null }
  | { kind: "unsaved" }
  | { kind: "saving" }
  | { kind: "conflict"; message: string; currentLockVersion: number }
  | { kind: "error"; message: string };

const AUTOSAVE_MS = 1500;

function ToolButton({
  label,
  onClick,
  active,
  children,
}: {
  label: string;
  onClick: () => void;
  active?: boolean;
  children: ReactNode;
}) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      aria-pressed={active}
      onClick={onClick}
      className="rounded p-1.5 text-stone-700 hover:bg-stone-100 aria-pressed:bg-brand-100 aria-pressed:text-brand-900"
    >
      {children}
    </button>
  );
}

function Toolbar({ editor }: { editor: Editor }) {
  const icon = "h-4 w-4";
  const link = () => {
    const previous = editor.getAttributes("link").href as string | undefined;
    const href = window.prompt(
      "Link address (https://…, mailto:… or /documents/…); leave empty to remove the link",
      previous ?? "",
    );
    if (href === null) return;
    if (href.trim() === "") editor.chain().focus().unsetLink().run();
    else if (isSafeHref(href))
      editor.chain().focus().extendMarkRange("link").setLink({ href: href.trim() }).run();
    else
      window.alert(
        "Links may point to web pages (https://), e-mail addresses (mailto:) or pages inside Washproof (/…).",
      );
  };
  return (
    <div
      role="toolbar"
      aria-label="Formatting"
      className="sticky top-14 z-[5] flex flex-wrap gap-0.5 border-b border-stone-200 bg-white p-1"
    >
      <ToolButton
        label="Bold"
        active={editor.isActive("bold")}
        onClick={() => editor.chain().focus().toggleBold().run()}
      >
        <Bold className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Italic"
        active={editor.isActive("italic")}
        onClick={() => editor.chain().focus().toggleItalic().run()}
      >
        <Italic className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Heading"
        active={editor.isActive("heading", { level: 2 })}
        onClick={() => editor.chain().focus().toggleHeading({ level: 2 }).run()}
      >
        <Heading2 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Subheading"
        active={editor.isActive("heading", { level: 3 })}
        onClick={() => editor.chain().focus().toggleHeading({ level: 3 }).run()}
      >
        <Heading3 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Bulleted list"
        active={editor.isActive("bulletList")}
        onClick={() => editor.chain().focus().toggleBulletList().run()}
      >
        <List className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Numbered list"
        active={editor.isActive("orderedList")}
        onClick={() => editor.chain().focus().toggleOrderedList().run()}
      >
        <ListOrdered className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton label="Link" active={editor.isActive("link")} onClick={link}>
        <Link2 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Insert table"
        onClick={() =>
          editor.chain().focus().insertTable({ rows: 3, cols: 3, withHeaderRow: true }).run()
        }
      >
        <Table className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton label="Add table row" onClick={() => editor.chain().focus().addRowAfter().run()}>
        <Rows3 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton
        label="Add table column"
        onClick={() => editor.chain().focus().addColumnAfter().run()}
      >
        <Columns3 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton label="Undo" onClick={() => editor.chain().focus().undo().run()}>
        <Undo2 className={icon} aria-hidden="true" />
      </ToolButton>
      <ToolButton label="Redo" onClick={() => editor.chain().focus().redo().run()}>
        <Redo2 className={icon} aria-hidden="true" />
      </ToolButton>
    </div>
  );
}

/**
 * The rich-text editor for a draft. It saves a moment after typing stops,
 * naming the version counter it last read; a stale save is refused by the
 * server and the text stays here until the author decides what to do.
 */
export default function DocumentEditor({
  versionId,
  initialContent,
  initialLockVersion,
}: DocumentEditorProps) {
  const lockVersion = useRef(initialLockVersion);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const [state, setState] = useState<SaveState>({ kind: "saved", at: null });
  const blocked = state.kind === "conflict";

  const editor = useEditor({
    immediatelyRender: false,
    extensions: [
      StarterKit.configure({
        heading: { levels: [1, 2, 3, 4] },
        link: {
          openOnClick: false,
          autolink: true,
          defaultProtocol: "https",
          isAllowedUri: (url) => isSafeHref(url),
        },
      }),
      TableKit.configure({ table: { resizable: false } }),
    ],
    content: initialContent,
    editorProps: {
      attributes: {
        role: "textbox",
        "aria-multiline": "true",
        "aria-label": "Document text",
        class: "prose prose-stone max-w-none min-h-[50vh] px-6 py-4 focus:outline-none",
      },
    },
  });

  const save = useCallback(
    async (opts: { overwrite?: boolean; lock?: number } = {}) => {
      if (!editor) return;
      if (timer.current) clearTimeout(timer.current);
      setState({ kind: "saving" });
      const result = await saveDraftAction({
        versionId,
        lockVersion: opts.lock ?? lockVersion.current,
        content: JSON.stringify(editor.getJSON()),
        overwrite: opts.overwrite ?? false,
      });
      if (result.ok) {
        lockVersion.current = result.lockVersion;
        setState({ kind: "saved", at: result.savedAt });
      } else if ("conflict" in result && result.conflict) {
        setState({
          kind: "conflict",
          message: result.message,
          currentLockVersion: result.currentLockVersion,
        });
      } else {
        setState({ kind: "error", message: result.message });
      }
    },
    [editor, versionId],
  );

  useEffect(() => {
    if (!editor) return;
    const onUpdate = () => {
      setState((s) => (s.kind === "conflict" ? s : { kind: "unsaved" }));
      if (timer.current) clearTimeout(timer.current);
      if (!blocked) timer.current = setTimeout(() => void save(), AUTOSAVE_MS);
    };
    editor.on("update", onUpdate);
    return () => {
      editor.off("update", onUpdate);
    };
  }, [editor, save, blocked]);

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (state.kind !== "saved") e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [state.kind]);

  return (
    <div className="rounded-lg border border-stone-200 bg-white">
      {editor ? <Toolbar editor={editor} /> : null}
      <div className="flex flex-wrap items-center justify-between gap-2 border-b border-stone-100 px-3 py-2 text-sm">
        <p role="status" aria-live="polite" className="text-stone-700">
          {state.kind === "saved" &&
            (state.at ? `All changes saved at ${state.at.slice(11, 19)} UTC.` : "No changes yet.")}
          {state.kind === "unsaved" && "Unsaved changes…"}
          {state.kind === "saving" && "Saving…"}
          {state.kind === "conflict" && "Not saved: conflict."}
          {state.kind === "error" && "Not saved."}
        </p>
        <Button
          variant="secondary"
          onClick={() => void save()}
          disabled={blocked || state.kind === "saving"}
        >
          Save now
        </Button>
      </div>
      {(state.kind === "conflict" || state.kind === "error") && (
        <div
          role="alert"
          className="border-b border-red-200 bg-red-50 px-3 py-2 text-sm text-red-900"
        >
          <p>{state.message}</p>
          {state.kind === "conflict" && (
            <div className="mt-2 flex flex-wrap gap-2">
              <Button
                variant="danger"
                onClick={() => void save({ overwrite: true, lock: state.currentLockVersion })}
              >
                Save my text over theirs
              </Button>
              <Button variant="secondary" onClick={() => window.location.reload()}>
                Discard mine and load theirs
              </Button>
            </div>
          )}
        </div>
      )}
      {editor ? (
        <EditorContent editor={editor} />
      ) : (
        <p className="px-6 py-4 text-sm text-stone-600">Loading the editor…</p>
      )}
    </div>
  );
}
