import { describe, expect, it } from 'vitest';
import { MAX_MEETINGS, MAX_PIECE_PAIRS } from '../geometry/intersect';
import { MAX_WINDING_TESTS } from '../geometry/nesting';
import searchStopped from './search-stopped';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('search-stopped', () => {
  it('accepts a file whose search finishes (a bow-tie: one crossing)', () => {
    expect(run(searchStopped, '<path d="M0 0L2 2L2 0L0 2Z"/>')).toEqual([]);
  });

  it('reports the meetings limit at the first crossing of a grid of 317 × 317 lines (317² = 100 489 crossings, closed form)', () => {
    const n = 317;
    const lines = Array.from({ length: n }, (_, k) => `<path d="M${k + 0.5} 0V${n}"/><path d="M0 ${k + 0.5}H${n}"/>`).join('');
    expect(n * n).toBeGreaterThan(MAX_MEETINGS);
    const found = run(searchStopped, lines);
    expect(found).toEqual([{ messageId: 'meetings', at: expect.stringMatching(/^[HV]317$/), data: { limit: MAX_MEETINGS }, related: undefined }]);
  });

  it('reports the pairs limit at the first contour when 3200 parallel lines lie close but never meet (3200·3199/2 = 5 118 400 pairs of boxes, closed form)', () => {
    const n = 3200;
    expect((n * (n - 1)) / 2).toBeGreaterThan(MAX_PIECE_PAIRS);
    const lines = Array.from({ length: n }, (_, k) => `<path d="M${k / 1000} 0L${100 + k / 1000} 100"/>`).join('');
    expect(run(searchStopped, lines)).toEqual([{ messageId: 'pairs', at: 'M0 0L100 100', data: { limit: MAX_PIECE_PAIRS }, related: undefined }]);
  });

  it('reports where the nesting tests stopped on 600 stacked squares (each of the 4 sample points of each square is on each other square: 4·600·599 tests, closed form)', () => {
    expect(4 * 600 * 599).toBeGreaterThan(MAX_WINDING_TESTS);
    const found = run(searchStopped, '<rect width="10" height="10"/>'.repeat(600));
    expect(found.map((f) => f.messageId)).toEqual(['meetings', 'nesting']);
    expect(found[1]).toMatchObject({ at: '<rect width="10" height="10"/>', data: { limit: MAX_WINDING_TESTS } });
  });
});

