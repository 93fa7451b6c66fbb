import 'server-only';
import { Marked } from 'marked';

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const SAFE_URL = /^(https?:|mailto:|\/|#)/i;

/**
 * Markdown of study text blocks to HTML, sanitised: raw HTML in the source is shown as text,
 * links and images keep only http(s), mailto and same-site targets.
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
      if (!SAFE_URL.test(href)) return inner;
      return `<a href="${escape(href)}" rel="nofollow noopener"${title ? ` title="${escape(title)}"` : ''}>${inner}</a>`;
    },
    image({ href, text }) {
      return SAFE_URL.test(href) ? `<img src="${escape(href)}" alt="${escape(text)}">` : escape(text);
    },
  },
});

export function renderMarkdown(source: string): string {
  return md.parse(source) as string;
}
