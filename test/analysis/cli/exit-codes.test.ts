import { spawn } from 'node:child_process';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import * as fit from '../../../analysis/cli/fit';
import { nonFiniteResultMessage } from '../../../analysis/cli/finite-result';

// The command line's contract (analysis/cli.ts header; common practice for Unix tools): one JSON
// object on stdout and exit 0 for a result, the message on stderr and exit 2 for malformed input.

const root = path.resolve(__dirname, '..', '..', '..');

/** Runs the CLI with tsx, input on stdin, and reads stdout and stderr through real pipes. */
function cli(cmd: string, input: unknown): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'analysis/cli.ts'), cmd], { stdio: ['pipe', 'pipe', 'pipe'] });
    const out: Buffer[] = [], err: Buffer[] = [];
    child.stdout.on('data', (d: Buffer) => out.push(d));
    child.stderr.on('data', (d: Buffer) => err.push(d));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stdout: Buffer.concat(out).toString('utf8'), stderr: Buffer.concat(err).toString('utf8') }));
    child.stdin.end(JSON.stringify(input));
  });
}

const LONG = 120_000;
const x = [1, 2, 3, 4, 5], y = [2.1, 3.9, 6.2, 7.8, 10.1];

describe('fit: invalid input is malformed input (exit 2), a fit that cannot be done is a result (exit 0)', () => {
  test.each([
    ['x and y of different lengths', { x, y: [1, 2, 3], model: 'poly1' }, /y has 3 values but x has 5/],
    ['a number that overflows double precision', { x, y: [2.1, 3.9, Infinity, 7.8, 10.1], model: 'poly1' }, /y\[2\] is not a finite number \(got Infinity: too large/],
    ['a weight that is not positive', { x, y, model: 'poly1', weights: [1, 1, 0, 1, 1] }, /weights\[2\] must be > 0/],
    ['bounds with low above high', { x, y, model: 'b0 + b1*x', start: { b0: 0, b1: 1 }, bounds: { b1: [3, 1] } }, /bounds\.b1/],
    ['a level outside (0, 1)', { x, y, model: 'poly1', level: 1.5 }, /level must be in \(0, 1\)/],
    ['a missing covariate', { x, y, model: 'exp-inlet' }, /needs the covariate Tin/],
  ])('%s', (_label, input, msg) => {
    expect(() => fit.run(input)).toThrow(expect.objectContaining({ name: 'InputError', message: expect.stringMatching(msg) }));
  });
  test('through the process: exit 2 with the message on stderr, nothing on stdout', async () => {
    const r = await cli('fit', { x, y: [1, 2, 3], model: 'poly1' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/malformed input: y has 3 values but x has 5/);
    expect(r.stdout).toBe('');
  }, LONG);
  test('a fit that cannot be done still exits 0 with ok:false', async () => {
    const r = await cli('fit', { x: [1, 1, 1], y: [1, 2, 3], model: 'poly1' });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toMatchObject({ ok: false, code: 'degenerate-x' });
  }, LONG);
});

describe('a large result reaches a pipe whole (no exit before stdout is flushed)', () => {
  test('a leap year of hourly samples: about 0.6 MB of JSON through a pipe, parsed whole', async () => {
    const r = await cli('forecast', {
      poolVolume: '40 m^3', startTemp: '18 degC', hours: 8784, step: '3600 s', flow: '9 L/min',
      heater: { model: 'coil', sourceTemp: '88 degC', UA: '430 W/K' }, losses: false,
    });
    expect(r.status).toBe(0);
    expect(r.stdout.length).toBeGreaterThan(4 * 65536);
    const out = JSON.parse(r.stdout);
    expect(out.series).toHaveLength(8785);
    expect(out.series[8784].time_h).toBe(8784);
  }, LONG);
});

describe('a result that would hold a non-finite number is refused (exit 2), naming the field and the input', () => {
  test('the one check over the output names the first non-finite field and the extreme inputs', () => {
    expect(nonFiniteResultMessage({ a: 1, b: [2, 3] }, {})).toBeNull();
    const m = nonFiniteResultMessage({ heat_W: 5, heatCeiling_W: Infinity }, { UA: '1e308 W/K', flow: '6 L/min' });
    expect(m).toMatch(/heatCeiling_W/);
    expect(m).toMatch(/UA \("1e308 W\/K"\)/);
    expect(m).not.toMatch(/flow/);
  });
  test('a UA of 1e308 W/K: the coil command exits 2 naming heatCeiling_W and UA', async () => {
    const r = await cli('coil', { sourceTemp: '88 degC', inletTemp: '17.5 degC', UA: '1e308 W/K', flow: '9 L/min' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/heatCeiling_W/);
    expect(r.stderr).toMatch(/UA/);
  }, LONG);
  test('a price of 1e308 and a build item of 1e308: the cost command exits 2 naming the field', async () => {
    const price = await cli('cost', { fuel: 'propane', price: 1e308, efficiency: 0.5 });
    expect(price.status).toBe(2);
    expect(price.stderr).toMatch(/cost_per_useful_therm/);
    expect(price.stderr).toMatch(/price \(1e\+308\)/);
    const build = await cli('cost', { fuel: 'propane', price: 3, efficiency: 0.8, build: { items: [{ subassembly: 'coil', description: 'tube', quantity: 10, unitCost: 1e308 }] } });
    expect(build.status).toBe(2);
    expect(build.stderr).toMatch(/build\./);
    expect(build.stderr).toMatch(/unitCost/);
  }, LONG);
});

describe('inputs beyond where the models are physical are refused by the models themselves (common practice)', () => {
  test.each([
    ['coil', { sourceTemp: '1e300 degC', inletTemp: '17.5 degC', UA: '430 W/K', flow: '9 L/min' }, /sourceTemp/],
    ['forecast', { poolVolume: '40 m^3', startTemp: '18 degC', hours: 2, flow: '9 L/min', heater: { model: 'coil', sourceTemp: '5000 degC', UA: '430 W/K' }, losses: false }, /sourceTemp/],
    ['forecast', { poolVolume: '40 m^3', startTemp: '18 degC', hours: 2, flow: '9 L/min', heater: { model: 'fixed-rise', rise: '-5 K' }, losses: false }, /rise.*cool/],
    ['forecast', { poolVolume: '40 m^3', startTemp: '18 degC', hours: 2, flow: '9 L/min', heater: { model: 'fixed-rise', rise: '5 K' }, losses: { surfaceArea: '30 m^2', weather: { airTemp: '20 degC', relativeHumidity: 0.5 }, radiation: { emissivity: 1.5 } } }, /emissivity/],
    ['forecast', { poolVolume: '40 m^3', startTemp: '18 degC', hours: 2, flow: '9 L/min', heater: { model: 'fixed-rise', rise: '5 K' }, losses: { surfaceArea: '30 m^2', weather: { airTemp: '20 degC', relativeHumidity: 0.5 }, solar: { absorptance: 1.2 } } }, /absorptance/],
  ])('%s %j', async (cmd, input, msg) => {
    const { run } = (await import(`../../../analysis/cli/${cmd}.ts`)) as { run(i: unknown): unknown };
    expect(() => run(input)).toThrow(expect.objectContaining({ name: 'InputError', message: expect.stringMatching(msg) }));
  });
});
