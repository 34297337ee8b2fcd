import { describe, expect, it } from 'vitest';
import contoursCross from './contours-cross';
import { runCheck as run } from '../../../../test/support/runCheck';

describe('contours-cross', () => {
  it('accepts a hole inside its outline', () => {
    expect(run(contoursCross, '<path d="M0 0H10V10H0Z M2 2H8V8H2Z"/>')).toEqual([]);
  });
  it('reports both crossings of two overlapping squares, on the later contour (by hand: x = 10 meets y = 5 at (10, 5); the closing edge x = 5 meets y = 10 at (5, 10))', () => {
    const f = run(contoursCross, '<path d="M0 0H10V10H0Z"/><path d="M5 5H15V15H5Z"/>');
    expect(f.map((x) => [x.at, x.data.xMm, x.data.yMm, x.data.otherContour])).toEqual([
      ['H15', 10, 5, 0],
      ['Z', 5, 10, 0],
    ]);
  });
});
