/**
 * The DXF bench's least reader (readLeast) must find what the file holds, or the lower bound it gives
 * would be that of a reader doing less than the job.
 */
import DxfParser from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { makeLooseDxf, readLeast } from './looseDxf';

describe('readLeast', () => {
  it('finds every outline of the bench file, open, with its length (arc length rθ, handbook formula; entities counted by dxf-parser)', () => {
    const entities = 4000;
    const text = makeLooseDxf(entities);
    expect(new DxfParser().parseSync(text)?.entities.length).toBe(entities);
    const least = readLeast(text);
    // Each outline: edges of 10, 15 and 15 mm and a quarter circle of radius 5 mm.
    const outlines = entities / 4;
    expect(least).toMatchObject({ contours: outlines, open: outlines });
    expect(least.lengthMm).toBeCloseTo(outlines * (40 + (Math.PI / 2) * 5), 6);
  });

  it('closes a square drawn as four reversed, shuffled lines (perimeter 4a)', () => {
    const line = (x0: number, y0: number, x1: number, y1: number) => `0\nLINE\n8\n0\n10\n${x0}\n20\n${y0}\n11\n${x1}\n21\n${y1}\n`;
    const text = `0\nSECTION\n2\nENTITIES\n${line(0, 0, 7, 0)}${line(7, 7, 0, 7)}${line(7, 7, 7, 0)}${line(0, 0, 0, 7)}0\nENDSEC\n0\nEOF\n`;
    expect(readLeast(text)).toEqual({ contours: 1, open: 0, lengthMm: 28 });
  });
});
