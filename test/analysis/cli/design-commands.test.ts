import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, test } from 'vitest';

// The collector, plan and compare commands through the real command line (one spawn each: a tsx start is slow):
// one JSON object out and exit 0 for a result, ok true or false; exit 2 for malformed input (analysis/cli.ts).
// Each command's own tests check its fields and its InputErrors.
const root = path.resolve(__dirname, '..', '..', '..');
const cli = (cmd: string, input: unknown) =>
  spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'analysis/cli.ts'), cmd], { input: JSON.stringify(input), encoding: 'utf8' });

// Each case starts Node with tsx; on a loaded machine that takes seconds. The timeout is a hang guard, not a timing.
describe('the new commands on the command line', { timeout: 90_000 }, () => {
  test('collector prints a result and exits 0', () => {
    const trial = (tin: number, tout: number, g: number) => ({ irradiance: `${g} W/m^2`, inletTemp: `${tin} degC`, outletTemp: `${tout} degC`, ambientTemp: '22 degC', flow: '2.4 L/min' });
    const r = cli('collector', { grossArea: '2 m^2', trials: [trial(22.5, 30.1, 950), trial(40, 46.9, 960), trial(60, 66.1, 940), trial(80, 84.8, 970), trial(41, 47.6, 990)] });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ ok: true, areaBasis: 'gross', n: 5 });
  });
  test('plan exits 2 for a trial count over the cap, naming the field', () => {
    const r = cli('plan', { model: 'coil', prior: { Ts: '90 degC', UA: '400 W/K' }, inletTemp: '15 degC', flowRange: ['2 L/min', '20 L/min'], maxOutletTemp: '95 degC', trials: 1000 });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/trials/);
  });
  test('compare prints {ok: false, reason} and exits 0 when a design cannot be fitted', () => {
    const a = { x: [5e-5, 1e-4, 2e-4, 3e-4], y: [70, 55, 42, 35], covariates: { Tin: [15, 15, 15, 15] } };
    const b = { x: [1e-4, 1e-4, 1e-4], y: [50, 51, 52], covariates: { Tin: [15, 15, 15] } };
    const r = cli('compare', { model: 'coil', a, b, bootstrap: false });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ ok: false, reason: expect.stringMatching(/^B: /) });
  });
  test('compare exits 2 for malformed input, naming the field (the issue\'s contract)', () => {
    const a = { x: [5e-5, 1e-4, 2e-4, 3e-4], y: [70, 55, 42, 35], covariates: { Tin: [15, 15, 15, 15] } };
    const r = cli('compare', { model: 'coil', a, b: { ...a, y: [70, 55] } });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/b\.y has 2 values/);
  }, 60_000); // one tsx start: slow on a busy machine
});
