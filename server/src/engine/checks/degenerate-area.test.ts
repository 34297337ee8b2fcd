import { describe, expect, it } from 'vitest';
import degenerateArea from './degenerate-area';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('degenerate-area', () => {
  it('accepts a square and a bow-tie (whose zero net area is a crossing, not a sliver; REFERENCES.md §1.4)', () => {
    expect(run(degenerateArea, '<path d="M0 0H10V10H0Z"/><path d="M20 0L22 2L22 0L20 2Z"/>')).toEqual([]);
  });
  it('reports a closed contour drawn out and back along one line: area 0 for 20 mm of outline (by hand)', () => {
    expect(run(degenerateArea, '<path d="M0 0L10 0Z"/>')).toEqual([
      { messageId: 'degenerate', at: 'M0 0L10 0Z', data: { areaMm2: 0, perimeterMm: 20 }, related: undefined },
    ]);
  });
});
