import { describe, expect, test } from 'vitest';
import { LruCache } from '../../../analysis/fit/lru-cache';

// The least-recently-used policy (common practice): a hit refreshes an entry, an insertion beyond
// the capacity evicts the entry used longest ago.
describe('LruCache', () => {
  test('computes a value once and returns the kept value on later hits', () => {
    const cache = new LruCache<number>(2);
    let made = 0;
    expect(cache.get('a', () => ++made)).toBe(1);
    expect(cache.get('a', () => ++made)).toBe(1);
    expect(made).toBe(1);
  });

  test('evicts the least recently used entry, not the oldest inserted', () => {
    const cache = new LruCache<string>(2);
    cache.get('a', () => 'A');
    cache.get('b', () => 'B');
    cache.get('a', () => 'A again'); // a is now the most recently used
    cache.get('c', () => 'C');
    expect(cache.size).toBe(2);
    expect(cache.has('a')).toBe(true);
    expect(cache.has('b')).toBe(false);
    expect(cache.has('c')).toBe(true);
  });

  test('keeps a null value as a result (an expression that cannot be compiled is not retried)', () => {
    const cache = new LruCache<null>(3);
    let made = 0;
    cache.get('bad', () => { made++; return null; });
    cache.get('bad', () => { made++; return null; });
    expect(made).toBe(1);
  });

  test('never holds more than its capacity', () => {
    const cache = new LruCache<number>(5);
    for (let k = 0; k < 100; k++) cache.get(`m${k}`, () => k);
    expect(cache.size).toBe(5);
    expect(cache.has('m99') && cache.has('m95') && !cache.has('m94')).toBe(true);
  });

  test('a deleted entry is made again on the next get, and the order of the rest is kept', () => {
    const cache = new LruCache<number>(2);
    let made = 0;
    cache.get('a', () => { made++; return 1; });
    cache.get('b', () => 2);
    cache.delete('b');
    expect(cache.has('b')).toBe(false);
    expect(cache.get('b', () => { made++; return 3; })).toBe(3);
    cache.get('c', () => 4); // 'a' was used longest ago: it goes
    expect([cache.has('a'), cache.has('b'), cache.has('c'), made]).toEqual([false, true, true, 2]);
  });

  test.each([0, -1, 2.5, Number.NaN])('refuses capacity %s with a RangeError', (c) => {
    expect(() => new LruCache<number>(c)).toThrow(RangeError);
  });
});
