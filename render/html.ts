// Escaping and the Markdown renderer used for worksheet prose.
import { Marked } from "../runner/parsers.ts";

/** Escape text for HTML element content and attribute values. */
export function escapeHtml(text: string): string {
  return text
    .replaceAll("&", "&amp;")
    .replaceAll("<", "&lt;")
    .replaceAll(">", "&gt;")
    .replaceAll('"', "&quot;")
    .replaceAll("'", "&#39;");
}

/** Link targets prose may use: web, mail, and relative paths. Nothing else. */
function safeHref(href: string): string | null {
  const h = href.trim();
  if (/^(https?:|mailto:)/i.test(h)) return h;
  if (/^[a-z][a-z0-9+.-]*:/i.test(h) || h.startsWith("//")) return null;
  return h;
}

const prose = new Marked({
  gfm: true,
  renderer: {
    // Raw HTML in prose is shown as text, never interpreted.
    html(token) {
      return escapeHtml(token.text);
    },
    // Worksheet headings sit one level below the report's own.
    heading(token) {
      const level = Math.min(6, token.depth + 1);
      return `<h${level}>${this.parser.parseInline(token.tokens)}</h${level}>\n`;
    },
    link(token) {
      const href = safeHref(token.href);
      const text = this.parser.parseInline(token.tokens);
      return href === null ? text : `<a href="${escapeHtml(href)}">${text}</a>`;
    },
    image(token) {
      return `<span class="image-text">[image: ${escapeHtml(token.text)}]</span>`;
    },
  },
});

/** Prose already rendered in this process (a run renders its prose while its child computes). */
const rendered = new Map<string, string>();

/** Render worksheet prose (CommonMark + tables) to safe HTML. */
export function proseToHtml(markdown: string): string {
  let html = rendered.get(markdown);
  if (html === undefined) {
    html = prose.parse(markdown, { async: false }) as string;
    if (rendered.size >= 256) rendered.clear();
    rendered.set(markdown, html);
  }
  return html;
}

/**
 * The start of every page tapsheet writes, to the opening <body>: no scripts
 * (the Content-Security-Policy forbids them), styles inline, images only from
 * the report's own folder when `images` is true. `title` is escaped here;
 * `css` is the stylesheet text as is.
 */
export function pageHead(title: string, css: string, images = true): string {
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none';${
    images ? " img-src 'self' file: data:;" : ""
  } style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'">
<title>${escapeHtml(title)}</title>
<style>${css}</style>
</head>
<body>
`;
}
