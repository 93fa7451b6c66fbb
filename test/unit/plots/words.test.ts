import { describe, expect, test } from 'vitest';
import { sentences } from '@/app/_plots/words';

describe('plot summary sentences', () => {
  test('capitalise a clause that opens with a Latin letter and end each with a full stop', () => {
    expect(sentences(['the pool warms', '', 'it reaches the target!'])).toBe('The pool warms. It reaches the target!');
  });

  test('leave a clause that opens with a symbol as it is: η0 is not Η0 (the capital of U+03B7 η is U+0397 Η, Unicode Character Database)', () => {
    expect(sentences(['η0 = 0.72 ± 0.002', 'ΔT falls with flow'])).toBe('η0 = 0.72 ± 0.002. ΔT falls with flow.');
  });
});
