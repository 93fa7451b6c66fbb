import { describe, expect, test } from 'vitest';
import { renderMarkdown } from '../../app/_lib/markdown';

// OWASP XSS prevention (common practice): user text never becomes markup or script.
describe('study text is Markdown, sanitised', () => {
  test('formats headings, emphasis and safe links', () => {
    const html = renderMarkdown('## Findings\n\n**UA** is [stable](https://example.test/a).');
    expect(html).toContain('<h2>Findings</h2>');
    expect(html).toContain('<strong>UA</strong>');
    expect(html).toContain('<a href="https://example.test/a" rel="nofollow noopener">stable</a>');
  });
  test.each([
    ['a script tag', '<script>alert(1)</script>', /<script/],
    ['an inline handler', '<img src=x onerror=alert(1)>', /<img/],
    ['a javascript: link', '[click](javascript:alert(1))', /href="javascript/],
    ['a javascript: image', '![x](javascript:alert(1))', /src="javascript/],
  ])('neutralises %s', (_what, source, bad) => {
    expect(renderMarkdown(source)).not.toMatch(bad);
  });
});
