/**
 * axe-core in a page (pinned, evaluated through the DevTools protocol so that the page's
 * Content-Security-Policy stays as it is), with the WCAG 2.1 A/AA rules and axe's best practices.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';

const AXE_SOURCE = readFileSync(path.resolve(__dirname, '..', '..', '..', 'node_modules', 'axe-core', 'axe.min.js'), 'utf8');
const AXE_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'];

/** Serious and critical axe findings on the page as it is now, one line each. */
export async function axeFindings(p: Page): Promise<string[]> {
  // the page at rest: no pointer over a control (a hover colour is a state, not the page), no colour
  // transition half-way (axe would judge the contrast of a blend that is on screen for 150 ms)
  await p.mouse.move(0, 0);
  await p.evaluate(() => Promise.all(document.getAnimations().map((a) => a.finished.catch(() => undefined))));
  // evaluated through the DevTools protocol, which the page's Content-Security-Policy does not govern
  await p.evaluate(AXE_SOURCE);
  const violations = await p.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[]; failureSummary?: string }[] }[] }> } }).axe;
    const r = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 5).map((n) => `${n.target.join(' ')}${n.failureSummary ? ` (${n.failureSummary.split('\n').slice(1, 2).join('').trim()})` : ''}`) }));
  }, AXE_TAGS);
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.join('; ')}`);
}

