import { env } from "@/lib/env";

export interface RenderedEmail {
  subject: string;
  text: string;
  html: string;
}

function escapeHtml(s: string) {
  return s.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!,
  );
}

/**
 * Every Washproof e-mail: a plain-text body (what most mail clients and filters
 * read first) and the same paragraphs as simple HTML, with one link into the app.
 */
export function renderEmail(input: {
  subject: string;
  paragraphs: string[];
  link?: { label: string; path: string };
}): RenderedEmail {
  const url = input.link ? new URL(input.link.path, env().APP_URL).toString() : null;
  const text = [
    ...input.paragraphs,
    ...(url ? [`${input.link!.label}: ${url}`] : []),
    "",
    "— Washproof",
  ].join("\n\n");
  const html = [
    `<div style="font-family:system-ui,sans-serif;font-size:14px;color:#1c1917">`,
    ...input.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    url
      ? `<p><a href="${escapeHtml(url)}" style="color:#12524d">${escapeHtml(input.link!.label)}</a></p>`
      : "",
    `<p style="color:#78716c">— Washproof</p></div>`,
  ].join("");
  return { subject: `[Washproof] ${input.subject}`, text, html };
}
