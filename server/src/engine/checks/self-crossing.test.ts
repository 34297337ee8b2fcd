import { describe, expect, it } from 'vitest';
import selfCrossing from './self-crossing';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('self-crossing', () => {
  it('accepts a square', () => {
    expect(run(selfCrossing, '<path d="M0 0H10V10H0Z"/>')).toEqual([]);
  });
  it('reports the bow-tie crossing at (1, 1) on the later segment, with the other as related (REFERENCES.md §1.4)', () => {
    expect(run(selfCrossing, '<path d="M0 0L2 2L2 0L0 2Z"/>')).toEqual([
      { messageId: 'crossing', at: 'L0 2', data: { xMm: 1, yMm: 1 }, related: ['L2 2'] },
    ]);
  });
  it('does not report a touch (self-touch does)', () => {
    expect(run(selfCrossing, '<path d="M0 0L4 0L4 4L2 0L0 4Z"/>')).toEqual([]);
  });
});
