import { diffWordsWithSpace } from "diff";
import { plainText, type RichNode } from "./rich-text";

export interface RedlineSegment {
  kind: "same" | "inserted" | "deleted";
  text: string;
  /** An unchanged run long enough to fold away, keeping context either side. */
  collapsed?: boolean;
  words?: number;
}

export interface Redline {
  segments: RedlineSegment[];
  insertedWords: number;
  deletedWords: number;
}

const CONTEXT_WORDS = 12;
const FOLD_AT_WORDS = 40;

const countWords = (s: string) => (s.match(/\S+/g) ?? []).length;

/** Splits a long unchanged run into head, folded middle and tail, at word boundaries. */
function foldSame(text: string, first: boolean, last: boolean): RedlineSegment[] {
  const tokens = text.split(/(\s+)/);
  const wordIdx = tokens.map((t, i) => (/\S/.test(t) ? i : -1)).filter((i) => i >= 0);
  if (wordIdx.length < FOLD_AT_WORDS) return [{ kind: "same", text }];
  const headWords = first ? 0 : CONTEXT_WORDS;
  const tailWords = last ? 0 : CONTEXT_WORDS;
  const cutA = headWords === 0 ? 0 : wordIdx[headWords - 1] + 1;
  const cutB = tailWords === 0 ? tokens.length : wordIdx[wordIdx.length - tailWords];
  const head = tokens.slice(0, cutA).join("");
  const middle = tokens.slice(cutA, cutB).join("");
  const tail = tokens.slice(cutB).join("");
  return [
    ...(head ? [{ kind: "same" as const, text: head }] : []),
    { kind: "same" as const, text: middle, collapsed: true, words: countWords(middle) },
    ...(tail ? [{ kind: "same" as const, text: tail }] : []),
  ];
}

/** Word-level redline of two versions' content: insertions and deletions marked, long unchanged runs folded. */
export function redline(from: RichNode, to: RichNode): Redline {
  const changes = diffWordsWithSpace(plainText(from), plainText(to));
  const segments: RedlineSegment[] = [];
  let insertedWords = 0;
  let deletedWords = 0;
  changes.forEach((c, i) => {
    if (c.added) {
      insertedWords += countWords(c.value);
      segments.push({ kind: "inserted", text: c.value });
    } else if (c.removed) {
      deletedWords += countWords(c.value);
      segments.push({ kind: "deleted", text: c.value });
    } else {
      segments.push(...foldSame(c.value, i === 0, i === changes.length - 1));
    }
  });
  return { segments, insertedWords, deletedWords };
}
