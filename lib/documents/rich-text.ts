/**
 * The rich-text shape Washproof stores: the editor's JSON, limited to the nodes
 * and marks our toolbar offers. Anything else is refused or dropped on the server.
 */
export const BLOCK_TYPES = [
  "doc",
  "paragraph",
  "heading",
  "bulletList",
  "orderedList",
  "listItem",
  "blockquote",
  "codeBlock",
  "horizontalRule",
  "hardBreak",
  "table",
  "tableRow",
  "tableHeader",
  "tableCell",
  "text",
] as const;
export const MARK_TYPES = ["bold", "italic", "strike", "underline", "code", "link"] as const;

export type RichNodeType = (typeof BLOCK_TYPES)[number];
export type RichMarkType = (typeof MARK_TYPES)[number];

export interface RichMark {
  type: RichMarkType;
  attrs?: { href?: string };
}

export interface RichNode {
  type: RichNodeType;
  attrs?: Record<string, unknown>;
  content?: RichNode[];
  text?: string;
  marks?: RichMark[];
}

export interface RichDoc extends RichNode {
  type: "doc";
  content: RichNode[];
}

/**
 * How deeply content may nest. A real protocol nests lists two or three levels
 * (common practice); a draft with lists 150 levels deep made the PDF renderer fail.
 */
export const MAX_LIST_DEPTH = 10;
export const MAX_NODE_DEPTH = 40;

/** The deepest list nesting and node nesting of raw editor JSON, walked without recursion. */
export function nestingDepth(root: unknown): { lists: number; nodes: number } {
  let lists = 0;
  let nodes = 0;
  const stack: { node: unknown; depth: number; listDepth: number }[] = [
    { node: root, depth: 1, listDepth: 0 },
  ];
  while (stack.length) {
    const { node, depth, listDepth } = stack.pop()!;
    if (typeof node !== "object" || node === null) continue;
    const { type, content } = node as { type?: unknown; content?: unknown };
    const inList = listDepth + (type === "bulletList" || type === "orderedList" ? 1 : 0);
    lists = Math.max(lists, inList);
    nodes = Math.max(nodes, depth);
    if (Array.isArray(content))
      for (const child of content) stack.push({ node: child, depth: depth + 1, listDepth: inList });
  }
  return { lists, nodes };
}

/** Links may point to web pages, mail addresses or places inside Washproof; never to script. */
export function isSafeHref(href: string): boolean {
  const h = href.trim();
  if (h.startsWith("/") && !h.startsWith("//")) return true;
  if (h.startsWith("#")) return true;
  return /^(https?:|mailto:)/i.test(h);
}

// Builders, used by the document templates.
export const text = (t: string, marks?: RichMark[]): RichNode =>
  marks ? { type: "text", text: t, marks } : { type: "text", text: t };
export const p = (...parts: (string | RichNode)[]): RichNode => ({
  type: "paragraph",
  content: parts.filter((x) => x !== "").map((x) => (typeof x === "string" ? text(x) : x)),
});
export const b = (t: string): RichNode => text(t, [{ type: "bold" }]);
export const h = (level: 1 | 2 | 3, t: string): RichNode => ({
  type: "heading",
  attrs: { level },
  content: [text(t)],
});
export const ul = (...items: (string | RichNode)[]): RichNode => ({
  type: "bulletList",
  content: items.map((i) => ({ type: "listItem", content: [typeof i === "string" ? p(i) : i] })),
});
export const ol = (...items: (string | RichNode)[]): RichNode => ({
  type: "orderedList",
  attrs: { start: 1 },
  content: items.map((i) => ({ type: "listItem", content: [typeof i === "string" ? p(i) : i] })),
});
export function table(header: string[], rows: string[][]): RichNode {
  const cell = (type: "tableHeader" | "tableCell", t: string): RichNode => ({
    type,
    attrs: { colspan: 1, rowspan: 1 },
    content: [p(t)],
  });
  return {
    type: "table",
    content: [
      { type: "tableRow", content: header.map((c) => cell("tableHeader", c)) },
      ...rows.map((r) => ({
        type: "tableRow" as const,
        content: r.map((c) => cell("tableCell", c)),
      })),
    ],
  };
}
export const doc = (...content: RichNode[]): RichDoc => ({ type: "doc", content });

/** Plain text of a node tree, one line per block: what the redline compares. */
export function plainText(node: RichNode): string {
  if (node.type === "text") return node.text ?? "";
  if (node.type === "hardBreak") return "\n";
  const inner = (node.content ?? []).map(plainText);
  switch (node.type) {
    case "doc":
      return inner.join("\n");
    case "heading":
    case "paragraph":
    case "codeBlock":
      return inner.join("");
    case "listItem":
      return `• ${inner.join("\n")}`;
    case "tableRow":
      return inner.join(" | ");
    case "tableHeader":
    case "tableCell":
      return inner.join(" ");
    case "horizontalRule":
      return "———";
    default:
      return inner.join("\n");
  }
}
