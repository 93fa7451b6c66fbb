import 'server-only';
import { Marked } from 'marked';

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** A path of this site: one leading slash, then not a second slash or a backslash (`//host` and `/\host` are other hosts). */
const SITE_PATH = /^\/(?![/\\])/;

/** Links may go to http(s) pages, paths of this site and anchors of the page. */
export function safeLinkHref(href: string): boolean {
  const h = href.trim();
  if (/[\u0000-\u001f\\]/.test(h)) return false;
  return /^https?:\/\/[^/\\]/i.test(h) || SITE_PATH.test(h) || /^#[\w-]*$/.test(h);
}

/**
 * Images only from the app itself (uploaded figures and photos, `/api/files/…`): a shared study
 * must not load anything from another host, which could watch who reads it (a tracking pixel).
 */
export function safeImageSrc(src: string): boolean {
  const s = src.trim();
  return SITE_PATH.test(s) && !/[\u0000-\u001f\\]/.test(s);
}

/**
 * Markdown of study text blocks to HTML, sanitised: raw HTML in the source is shown as text,
 * links keep only http(s) and same-site targets, images only same-site sources; anything else
 * is shown as its text.
 */
const md = new Marked({
  gfm: true,
  async: false,
  renderer: {
    html({ text }) {
      return escape(text);
    },
    link({ href, title, tokens }) {
      const inner = this.parser.parseInline(tokens);
      if (!safeLinkHref(href)) return inner;
      return `<a href="${escape(href.trim())}" rel="nofollow noopener noreferrer"${title ? ` title="${escape(title)}"` : ''}>${inner}</a>`;
    },
    image({ href, text }) {
      return safeImageSrc(href) ? `<img src="${escape(href.trim())}" alt="${escape(text)}">` : escape(text);
    },
  },
});

export function renderMarkdown(source: string): string {
  return md.parse(source) as string;
}
