import { createHash } from 'node:crypto';
import * as Plot from '@observablehq/plot';
import { describe, expect, test } from 'vitest';
import { plotToSvg } from '../../app/_lib/plots/plot-svg';
import { PLOT_STYLE_SHA256, commonHeaders, newNonce, pageCsp } from '../../app/_lib/server/security-headers';
import { fitCurveInputFromFits, fitCurvePlot } from '../../app/_lib/plots';
import { fitOrThrow } from './plots/support';

describe('security headers', () => {
  test('HSTS and upgrade-insecure-requests only for an https public origin', () => {
    // RFC 6797 §7.2: HSTS is sent over secure transport only; one year with subdomains per OWASP ASVS 4.0.3 V14.4.5 (from memory)
    expect(commonHeaders('https://lab.example.test')['Strict-Transport-Security']).toBe('max-age=31536000; includeSubDomains');
    expect(commonHeaders('http://127.0.0.1:3000')['Strict-Transport-Security']).toBeUndefined();
    expect(commonHeaders('')['Strict-Transport-Security']).toBeUndefined();
    expect(pageCsp('n', 'https://lab.example.test')).toContain('upgrade-insecure-requests');
    expect(pageCsp('n', 'http://127.0.0.1:3000')).not.toContain('upgrade-insecure-requests');
  });

  test('a nonce is 128 random bits and never repeats', () => {
    // CSP Level 3 §7.1 (W3C): a nonce is at least 128 bits, unguessable, fresh per response
    const nonces = new Set(Array.from({ length: 200 }, newNonce));
    expect(nonces.size).toBe(200);
    for (const n of nonces) expect(Buffer.from(n, 'base64')).toHaveLength(16);
  });

  test("the page policy allows the one <style> element Observable Plot writes, by its hash", () => {
    // every plot, from our own plot functions or a bare one, carries the same style element
    const svgs = [
      plotToSvg({ marks: [Plot.dot([[1, 2], [3, 4]])] }),
      // a coil fit over the trials of DOMAIN.md §1.2 (test/unit/plots/support.ts), as the fit page draws it
      plotToSvg(fitCurvePlot(fitCurveInputFromFits([{ label: 'coil', fit: fitOrThrow('coil') }]), 'si').options),
    ];
    for (const svg of svgs) {
      const styles = [...svg.matchAll(/<style>([\s\S]*?)<\/style>/g)].map((m) => m[1]);
      expect(styles.length).toBeGreaterThan(0);
      for (const css of styles) expect(createHash('sha256').update(css).digest('base64')).toBe(PLOT_STYLE_SHA256);
    }
    expect(pageCsp('n', '')).toContain(`'sha256-${PLOT_STYLE_SHA256}'`);
  });
});
