// Escaping and the Markdown renderer used for worksheet prose.
import { Marked } from "marked";

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

/** Render worksheet prose (CommonMark + tables) to safe HTML. */
export function proseToHtml(markdown: string): string {
  return prose.parse(markdown, { async: false }) as string;
}
