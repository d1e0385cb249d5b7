import type { RichMark, RichNode } from "./rich-text";
import { isSafeHref } from "./rich-text";
import { sanitizeRichHtml } from "./sanitize";

function escapeHtml(s: string) {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}

const MARK_TAGS: Record<Exclude<RichMark["type"], "link">, string> = {
  bold: "strong",
  italic: "em",
  strike: "s",
  underline: "u",
  code: "code",
};

function renderText(node: RichNode): string {
  let html = escapeHtml(node.text ?? "");
  for (const mark of node.marks ?? []) {
    if (mark.type === "link") {
      const href = mark.attrs?.href ?? "";
      if (isSafeHref(href)) html = `<a href="${escapeHtml(href)}">${html}</a>`;
    } else {
      const tag = MARK_TAGS[mark.type];
      html = `<${tag}>${html}</${tag}>`;
    }
  }
  return html;
}

function renderNode(node: RichNode): string {
  const inner = () => (node.content ?? []).map(renderNode).join("");
  const attr = (k: string) => node.attrs?.[k];
  switch (node.type) {
    case "doc":
      return inner();
    case "text":
      return renderText(node);
    case "paragraph":
      return `<p>${inner()}</p>`;
    case "heading": {
      const level = Math.min(4, Math.max(1, Number(attr("level")) || 2));
      return `<h${level}>${inner()}</h${level}>`;
    }
    case "bulletList":
      return `<ul>${inner()}</ul>`;
    case "orderedList": {
      const start = Number(attr("start")) || 1;
      return start === 1 ? `<ol>${inner()}</ol>` : `<ol start="${start}">${inner()}</ol>`;
    }
    case "listItem":
      return `<li>${inner()}</li>`;
    case "blockquote":
      return `<blockquote>${inner()}</blockquote>`;
    case "codeBlock":
      return `<pre><code>${inner()}</code></pre>`;
    case "horizontalRule":
      return "<hr>";
    case "hardBreak":
      return "<br>";
    case "table":
      return `<table><tbody>${inner()}</tbody></table>`;
    case "tableRow":
      return `<tr>${inner()}</tr>`;
    case "tableHeader":
    case "tableCell": {
      const tag = node.type === "tableHeader" ? "th" : "td";
      const span = ["colspan", "rowspan"]
        .map((k) => (Number(attr(k)) > 1 ? ` ${k}="${Number(attr(k))}"` : ""))
        .join("");
      return `<${tag}${span}>${inner()}</${tag}>`;
    }
    default:
      return "";
  }
}

/** Read-only HTML of stored content, rendered on the server and sanitised before it is sent. */
export function renderRichHtml(content: RichNode): string {
  return sanitizeRichHtml(renderNode(content));
}
