import { describe, expect, it } from 'vitest';
import selfTouch from './self-touch';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('self-touch', () => {
  it('accepts a square and a bow-tie (a crossing is not a touch)', () => {
    expect(run(selfTouch, '<path d="M0 0H10V10H0Z"/><path d="M20 0L22 2L22 0L20 2Z"/>')).toEqual([]);
  });
  it('reports a vertex lying on another edge of the same contour (common practice, no source)', () => {
    expect(run(selfTouch, '<path d="M0 0L4 0L4 4L2 0L0 4Z"/>')).toEqual([
      { messageId: 'touch', at: 'L2 0', data: { xMm: 2, yMm: 0 }, related: ['L4 0'] },
    ]);
  });
});
