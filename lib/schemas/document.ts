import { z } from "zod";
import "./messages";
import { calendarDate } from "./date";
import { storedText } from "@/lib/schemas/text";
import { DOCUMENT_TYPES, ROUTING_MODES } from "@/db/enums";
import {
  BLOCK_TYPES,
  isSafeHref,
  MARK_TYPES,
  MAX_LIST_DEPTH,
  MAX_NODE_DEPTH,
  nestingDepth,
  type RichDoc,
  type RichMark,
  type RichNode,
} from "@/lib/documents/rich-text";

/** A controlled document's content may be at most 2 MB of JSON. */
export const MAX_CONTENT_BYTES = 2 * 1024 * 1024;

export function contentTooLargeMessage(bytes: number) {
  return `This draft is ${(bytes / 1024 / 1024).toFixed(1)} MB of content; the limit is 2 MB. Nothing was saved and your text is still in the editor: shorten it or split it into two documents.`;
}

const markShape = z.object({
  type: z.string(),
  attrs: z.record(z.string(), z.unknown()).nullish(),
});

type RawNode = {
  type: string;
  attrs?: Record<string, unknown> | null;
  content?: RawNode[];
  text?: string;
  marks?: z.infer<typeof markShape>[];
};

const nodeShape: z.ZodType<RawNode> = z.lazy(() =>
  z.object({
    type: z.string(),
    attrs: z.record(z.string(), z.unknown()).nullish(),
    content: z.array(nodeShape).optional(),
    text: storedText().optional(),
    marks: z.array(markShape).optional(),
  }),
) as z.ZodType<RawNode>;

const intAttr = (v: unknown, min: number, max: number, fallback: number) =>
  typeof v === "number" && Number.isInteger(v) && v >= min && v <= max ? v : fallback;

/**
 * Rebuilds a node keeping only the nodes, marks and attributes our editor makes.
 * Text is kept as text (a typed "<script>" stays inert words); links to
 * anything but web, mail or in-app addresses lose their link.
 */
function cleanNode(node: RawNode, path: string, issues: string[]): RichNode | null {
  if (!(BLOCK_TYPES as readonly string[]).includes(node.type)) {
    issues.push(`${path}: "${node.type}" is not a kind of content documents may hold.`);
    return null;
  }
  const type = node.type as RichNode["type"];
  if (type === "text") {
    const marks: RichMark[] = [];
    for (const m of node.marks ?? []) {
      if (!(MARK_TYPES as readonly string[]).includes(m.type)) continue;
      if (m.type === "link") {
        const href = typeof m.attrs?.href === "string" ? m.attrs.href : "";
        if (isSafeHref(href)) marks.push({ type: "link", attrs: { href: href.trim() } });
        continue;
      }
      marks.push({ type: m.type as RichMark["type"] });
    }
    const t = node.text ?? "";
    return marks.length ? { type, text: t, marks } : { type, text: t };
  }
  const out: RichNode = { type };
  const a = node.attrs ?? {};
  if (type === "heading") out.attrs = { level: intAttr(a.level, 1, 4, 2) };
  if (type === "orderedList") out.attrs = { start: intAttr(a.start, 1, 10_000, 1) };
  if (type === "tableCell" || type === "tableHeader")
    out.attrs = { colspan: intAttr(a.colspan, 1, 50, 1), rowspan: intAttr(a.rowspan, 1, 500, 1) };
  if (node.content) {
    out.content = node.content
      .map((c, i) => cleanNode(c, `${path}.${i}`, issues))
      .filter((c): c is RichNode => c !== null);
  }
  return out;
}

/** The stored form of a document's content: validated shape, cleaned of anything we do not render. */
export const richDocSchema = nodeShape.transform((raw, ctx): RichDoc => {
  if (raw.type !== "doc") {
    ctx.addIssue({ code: "custom", message: "The content must be a whole document." });
    return z.NEVER;
  }
  const issues: string[] = [];
  const cleaned = cleanNode(raw, "doc", issues);
  for (const message of issues.slice(0, 3)) ctx.addIssue({ code: "custom", message });
  if (issues.length || !cleaned) return z.NEVER;
  return { type: "doc", content: cleaned.content ?? [] };
});

/** The draft as it travels from the editor: JSON text, checked for size before it is parsed. */
export const contentJsonSchema = z
  .string()
  .superRefine((s, ctx) => {
    const bytes = new TextEncoder().encode(s).length;
    if (bytes > MAX_CONTENT_BYTES)
      ctx.addIssue({ code: "custom", message: contentTooLargeMessage(bytes) });
  })
  .transform((s, ctx) => {
    let parsed: unknown;
    try {
      parsed = JSON.parse(s);
    } catch {
      ctx.addIssue({ code: "custom", message: "The draft could not be read. Nothing was saved." });
      return z.NEVER;
    }
    // Checked before the recursive schema walks it: depth, not size, is what breaks rendering.
    const depth = nestingDepth(parsed);
    if (depth.lists > MAX_LIST_DEPTH) {
      ctx.addIssue({
        code: "custom",
        message: `Lists are nested ${depth.lists} levels deep; at most ${MAX_LIST_DEPTH} levels can be saved and printed. Nothing was saved and your text is still in the editor: flatten the innermost lists.`,
      });
      return z.NEVER;
    }
    if (depth.nodes > MAX_NODE_DEPTH) {
      ctx.addIssue({
        code: "custom",
        message: `The content is nested ${depth.nodes} levels deep; at most ${MAX_NODE_DEPTH} can be saved and printed. Nothing was saved and your text is still in the editor.`,
      });
      return z.NEVER;
    }
    return parsed;
  })
  .pipe(richDocSchema);

const optionalId = z
  .string()
  .trim()
  .optional()
  .transform((v) => v || null)
  .pipe(z.string().uuid().nullable());

const percent = (label: string) =>
  z.coerce
    .number({ message: `Enter the ${label} in %.` })
    .gt(50, `The ${label} must be more than 50 %.`)
    .lt(100, `The ${label} must be less than 100 %.`);

export const createDocumentSchema = z.object({
  type: z.enum(DOCUMENT_TYPES, { message: "Choose the kind of document." }),
  title: storedText().trim().min(5, "Give the document a title of at least 5 characters.").max(200),
  systemId: optionalId,
  partFamilyId: optionalId,
  recipeVersionId: optionalId,
  /** For the sample plan in the template (success-run theorem). */
  confidencePct: percent("confidence"),
  reliabilityPct: percent("reliability"),
});
export type CreateDocumentInput = z.infer<typeof createDocumentSchema>;

export const saveDraftSchema = z.object({
  versionId: z.string().uuid(),
  lockVersion: z.number().int().min(0),
  content: contentJsonSchema,
  /** Set on an explicit "save my text over theirs" after a conflict. */
  overwrite: z.boolean().default(false),
});

const dateOnly = calendarDate();

export const submitSchema = z
  .object({
    versionId: z.string().uuid(),
    lockVersion: z.coerce.number().int().min(0),
    /** The hash of the draft as the author saw it in the signing dialog. */
    contentHash: z.string().regex(/^[0-9a-f]{64}$/),
    reviewerIds: z
      .array(z.string().uuid())
      .min(1, "Choose at least one reviewer.")
      .max(6, "Choose at most six reviewers."),
    approverId: z.string({ message: "Choose the approver." }).uuid("Choose the approver."),
    routing: z.enum(ROUTING_MODES, { message: "Choose in sequence or in parallel." }),
    dueDate: z
      .string()
      .trim()
      .optional()
      .transform((v) => v || null)
      .pipe(dateOnly.nullable()),
    password: z.string().min(1, "Enter your password to sign."),
  })
  .refine((v) => new Set(v.reviewerIds).size === v.reviewerIds.length, {
    path: ["reviewerIds"],
    message: "Each reviewer once.",
  })
  .refine((v) => !v.reviewerIds.includes(v.approverId), {
    path: ["approverId"],
    message: "The approver must be someone other than the reviewers.",
  });
export type SubmitInput = z.infer<typeof submitSchema>;

export const signStepSchema = z.object({
  versionId: z.string().uuid(),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
  password: z.string().min(1, "Enter your password to sign."),
});

export const approveSchema = signStepSchema.extend({
  effectiveDate: dateOnly,
});

export const returnSchema = z.object({
  versionId: z.string().uuid(),
  comment: storedText().trim().min(5, "Say what must change (at least 5 characters).").max(4000),
});

export const reasonSchema = z.object({
  documentId: z.string().uuid(),
  reason: storedText()
    .trim()
    .min(5, "Give the reason for the audit trail (at least 5 characters).")
    .max(2000),
});
