import { describe, expect, test } from 'vitest';
import { renderMarkdown } from '../../app/_lib/studies/markdown';

// OWASP XSS prevention (common practice): user text never becomes markup or script.
describe('study text is Markdown, sanitised', () => {
  test('formats headings, emphasis and safe links', () => {
    const html = renderMarkdown('## Findings\n\n**UA** is [stable](https://example.test/a).');
    expect(html).toContain('<h2>Findings</h2>');
    expect(html).toContain('<strong>UA</strong>');
    expect(html).toContain('<a href="https://example.test/a" rel="nofollow noopener noreferrer">stable</a>');
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

// A shared study is read by people outside the lab: nothing in it may fetch from another host or
// lead off-site by a disguised path (OWASP ASVS 4.0.3 V5.2 / V12.6, common practice).
describe('study text loads nothing from other hosts', () => {
  test.each([
    ['a remote image (tracking pixel)', '![x](https://tracker.example/p.gif)', /<img/],
    ['a protocol-relative image', '![x](//tracker.example/p.gif)', /<img/],
    ['a protocol-relative link', '[here](//evil.example/)', /<a /],
    ['a backslash host link', '[here](/\\evil.example/)', /<a /],
    ['a mailto link', '[mail](mailto:someone@example.test)', /<a /],
    ['a data: image', '![x](data:image/png;base64,AAAA)', /<img/],
  ])('drops %s', (_what, source, bad) => {
    expect(renderMarkdown(source)).not.toMatch(bad);
  });
  test('keeps figures uploaded to the app and links to its own pages', () => {
    const html = renderMarkdown('![coil](/api/files/00000000-0000-4000-8000-000000000000)\n\n[the rig](/rigs)');
    expect(html).toContain('<img src="/api/files/00000000-0000-4000-8000-000000000000" alt="coil">');
    expect(html).toContain('<a href="/rigs" rel="nofollow noopener noreferrer">the rig</a>');
  });
});
