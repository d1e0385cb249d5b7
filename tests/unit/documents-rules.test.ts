import { describe, expect, it } from "vitest";
import { DOCUMENT_STATUSES, ROLES, type DocumentStatus, type Role } from "@/db/enums";
import {
  checkTransition,
  DOCUMENT_ACTIONS,
  documentNumber,
  type DocumentAction,
} from "@/lib/documents/lifecycle";
import { redline } from "@/lib/documents/redline";
import { renderRichHtml } from "@/lib/documents/render-html";
import {
  doc,
  h,
  MAX_LIST_DEPTH,
  nestingDepth,
  p,
  ul,
  type RichNode,
} from "@/lib/documents/rich-text";
import { sanitizeRichHtml } from "@/lib/documents/sanitize";
import { contentJsonSchema, MAX_CONTENT_BYTES, richDocSchema } from "@/lib/schemas/document";

/** Written out independently of the rule table: from which states each action is allowed, by which role, and to where. */
const EXPECTED: Record<
  DocumentAction,
  { from: DocumentStatus[]; role: Role; to: DocumentStatus | null }
> = {
  edit: { from: ["draft"], role: "engineer", to: "draft" },
  submit: { from: ["draft"], role: "engineer", to: "in_review" },
  review: { from: ["in_review"], role: "reviewer", to: "in_review" },
  send_back: { from: ["in_review"], role: "reviewer", to: "draft" },
  approve: { from: ["in_review"], role: "approver", to: "approved" },
  reject: { from: ["in_review"], role: "approver", to: "draft" },
  make_effective: { from: ["approved"], role: "approver", to: "effective" },
  new_version: { from: ["approved", "effective"], role: "engineer", to: null },
  retire: { from: ["effective"], role: "approver", to: "retired" },
};

describe("document lifecycle (21 CFR 11.10(f))", () => {
  it("covers exactly the expected actions", () => {
    expect([...DOCUMENT_ACTIONS].sort()).toEqual(Object.keys(EXPECTED).sort());
  });
  for (const status of DOCUMENT_STATUSES) {
    for (const action of DOCUMENT_ACTIONS) {
      for (const role of ROLES) {
        const e = EXPECTED[action];
        const allowed = e.from.includes(status) && role === e.role;
        it(`${role} ${allowed ? "may" : "may not"} ${action} a ${status} version`, () => {
          const result = checkTransition(status, action, [role]);
          expect(result.ok).toBe(allowed);
          if (result.ok) expect(result.to).toBe(e.to);
          else expect(result.reason).toMatch(/role does not allow|cannot be/);
        });
      }
    }
  }
  it("a change narrative is only ever edited as a draft here: every other step belongs to its change request", () => {
    for (const action of DOCUMENT_ACTIONS) {
      for (const status of DOCUMENT_STATUSES) {
        const result = checkTransition(status, action, [...ROLES], "change_narrative");
        expect(result.ok, `${action} from ${status}`).toBe(action === "edit" && status === "draft");
        if (!result.ok && action !== "edit")
          expect(result.reason).toMatch(/moves only with its change request/);
      }
    }
    // Other types keep their own workflow.
    expect(checkTransition("draft", "submit", ["engineer"], "procedure").ok).toBe(true);
  });
  it("nothing leaves superseded or retired", () => {
    for (const action of DOCUMENT_ACTIONS) {
      expect(checkTransition("superseded", action, [...ROLES]).ok).toBe(false);
      expect(checkTransition("retired", action, [...ROLES]).ok).toBe(false);
    }
  });
});

describe("document numbers", () => {
  it("joins type prefix, system code without punctuation and a four-digit sequence", () => {
    expect(documentNumber("pq_protocol", "AW-3", 1)).toBe("PQ-AW3-0001");
    expect(documentNumber("report", "SC-1", 12)).toBe("VR-SC1-0012");
    expect(documentNumber("procedure", null, 7)).toBe("SOP-GEN-0007");
  });
});

describe("redline", () => {
  it("marks the inserted and deleted words between two known versions", () => {
    const v1 = doc(h(2, "Wash"), p("Wash at 60 °C for 4 min with ultrasonics."));
    const v2 = doc(h(2, "Wash"), p("Wash at 65 °C for 4 min with ultrasonics and spray."));
    const r = redline(v1, v2);
    expect(r.segments.filter((s) => s.kind === "deleted").map((s) => s.text.trim())).toEqual([
      "60",
    ]);
    expect(r.segments.filter((s) => s.kind === "inserted").map((s) => s.text.trim())).toEqual([
      "65",
      "and spray",
    ]);
    expect(r.insertedWords).toBe(3);
    expect(r.deletedWords).toBe(1);
    // Reassembling the unchanged and inserted runs gives the new text; unchanged and deleted, the old.
    const text = (kinds: string[]) =>
      r.segments
        .filter((s) => kinds.includes(s.kind))
        .map((s) => s.text)
        .join("");
    expect(text(["same", "inserted"])).toBe(
      "Wash\nWash at 65 °C for 4 min with ultrasonics and spray.",
    );
    expect(text(["same", "deleted"])).toBe("Wash\nWash at 60 °C for 4 min with ultrasonics.");
  });

  it("folds a long unchanged run and keeps context either side", () => {
    const long = Array.from({ length: 80 }, (_, i) => `word${i}`).join(" ");
    const r = redline(
      doc(p("Start."), p(long), p("End one.")),
      doc(p("Begin."), p(long), p("End two.")),
    );
    const folded = r.segments.find((s) => s.collapsed);
    expect(folded?.words).toBeGreaterThan(50);
    expect(
      r.segments.filter((s) => s.kind === "same" && !s.collapsed).length,
    ).toBeGreaterThanOrEqual(2);
  });
});

describe("sanitising rich text", () => {
  it("strips scripts, event handlers and javascript: links from HTML", () => {
    const html = sanitizeRichHtml(
      `<p onclick="steal()">Rinse <a href="javascript:alert(1)">here</a> <a href="https://example.test/sds">SDS</a></p><script>alert(1)</script><img src=x onerror="alert(2)">`,
    );
    expect(html).not.toMatch(/script|onclick|onerror|javascript:|<img/i);
    expect(html).toContain(
      '<a href="https://example.test/sds" rel="noopener noreferrer nofollow">SDS</a>',
    );
    expect(html).toContain("<p>Rinse <a");
  });

  it("keeps typed markup as inert text and drops unsafe links from stored content", () => {
    const parsed = richDocSchema.parse({
      type: "doc",
      content: [
        {
          type: "paragraph",
          attrs: { onclick: "x()" },
          content: [
            { type: "text", text: "<script>alert('x')</script>" },
            {
              type: "text",
              text: " click",
              marks: [{ type: "link", attrs: { href: "javascript:alert(1)" } }, { type: "bold" }],
            },
          ],
        },
      ],
    });
    expect(parsed.content[0].attrs).toBeUndefined();
    expect(parsed.content[0].content?.[1].marks).toEqual([{ type: "bold" }]);
    const html = renderRichHtml(parsed);
    expect(html).toBe("<p>&lt;script&gt;alert('x')&lt;/script&gt;<strong> click</strong></p>");
  });

  it("refuses node types the editor does not make", () => {
    const result = richDocSchema.safeParse({
      type: "doc",
      content: [{ type: "iframe", attrs: { src: "https://x" } }],
    });
    expect(result.success).toBe(false);
  });

  it("refuses content over 2 MB with a message that says the text is kept", () => {
    const big = JSON.stringify(doc(p("x".repeat(MAX_CONTENT_BYTES))));
    const result = contentJsonSchema.safeParse(big);
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toMatch(
      /limit is 2 MB.*your text is still in the editor/,
    );
    expect(contentJsonSchema.safeParse(JSON.stringify(doc(p("small")))).success).toBe(true);
  });

  const nestedLists = (levels: number): RichNode =>
    levels === 1 ? ul("innermost") : ul(nestedLists(levels - 1));
  it("measures list and node nesting without recursion, so a hostile depth cannot overflow the stack", () => {
    expect(nestingDepth(doc(p("flat")))).toEqual({ lists: 0, nodes: 3 });
    // doc > bulletList > listItem > bulletList > listItem > paragraph > text
    expect(nestingDepth(doc(nestedLists(2)))).toEqual({ lists: 2, nodes: 7 });
    let deep: unknown = { type: "text", text: "x" };
    for (let i = 0; i < 100_000; i++) deep = { type: "paragraph", content: [deep] };
    expect(nestingDepth(deep).nodes).toBe(100_001);
  });

  it("refuses lists nested deeper than can be printed, naming the depth and the limit", () => {
    expect(
      contentJsonSchema.safeParse(JSON.stringify(doc(nestedLists(MAX_LIST_DEPTH)))).success,
    ).toBe(true);
    const result = contentJsonSchema.safeParse(JSON.stringify(doc(nestedLists(150))));
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toMatch(
      /^Lists are nested 150 levels deep; at most 10 levels .* your text is still in the editor/,
    );
  });
});
