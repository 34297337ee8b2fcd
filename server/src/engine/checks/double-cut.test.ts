import { describe, expect, it } from 'vitest';
import doubleCut from './double-cut';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('double-cut', () => {
  it('accepts two squares sharing only a corner', () => {
    expect(run(doubleCut, '<path d="M0 0H10V10H0Z"/><path d="M10 10H20V20H10Z"/>')).toEqual([]);
  });
  it('reports a duplicated circle as cut twice over its whole length 2πr (REFERENCES.md §2.1)', () => {
    const f = run(doubleCut, '<circle cx="10" cy="10" r="5"/><circle cx="10" cy="10" r="5"/>');
    expect(f).toHaveLength(1);
    expect(f[0]!.messageId).toBe('otherContour');
    expect(f[0]!.data.lengthMm).toBeCloseTo(10 * Math.PI, 9);
    expect(f[0]!.data.otherContour).toBe(0);
  });
  it('reports a spike that doubles back along the previous line (REFERENCES.md §4.8)', () => {
    expect(run(doubleCut, '<path d="M0 0L4 0L2 0L2 3Z"/>')).toEqual([
      { messageId: 'sameContour', at: 'L2 0', data: { lengthMm: 2 }, related: ['L4 0'] },
    ]);
  });
  it('reports two squares sharing 6 mm of an edge (by hand)', () => {
    const f = run(doubleCut, '<path d="M0 0H10V5H0Z"/><path d="M4 0H14V-5H4Z"/>');
    expect(f.map((x) => x.data.lengthMm)).toEqual([6]);
  });
});
