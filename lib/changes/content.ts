import { canonicalJson, sha256Hex } from "@/lib/audit";
import type { RecipeSnapshot } from "./diff";

/** What the signatures on a change request bind to: the proposal, the narrative and the assessment. */
export function changeContentHash(input: {
  number: string;
  title: string;
  kind: string;
  partFamilyId: string | null;
  fromVersionId: string | null;
  proposal: RecipeSnapshot;
  narrative: unknown;
  impact: string | null;
  raiseReason: string | null;
  requirements: { testType: string; samples: number }[];
  /** An equipment or specification change: what it changes besides the recipe. */
  subject?: unknown;
}) {
  return sha256Hex(canonicalJson(input as unknown as Record<string, unknown>));
}

/** Plain text stored as a Tiptap-shaped document, so the rich-text editor can open it unchanged. */
export function narrativeDocument(text: string) {
  const paragraphs = text
    .split(/\n\s*\n/)
    .map((p) => p.trim())
    .filter(Boolean);
  return {
    type: "doc",
    content: paragraphs.map((p) => ({ type: "paragraph", content: [{ type: "text", text: p }] })),
  };
}

/** The narrative's text: paragraphs joined by blank lines. */
export function narrativeText(content: unknown): string {
  const doc = content as { content?: { content?: { text?: string }[] }[] } | null;
  return (doc?.content ?? [])
    .map((block) => (block.content ?? []).map((n) => n.text ?? "").join(""))
    .join("\n\n");
}
