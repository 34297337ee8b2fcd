import { describe, expect, it } from 'vitest';
import { getOcsMap, IDENTITY } from './transform';

describe('getOcsMap', () => {
  it('maps an extrusion along +Z, of any positive length, to the identity, and other directions not (REFERENCES.md §6.5, arbitrary axis algorithm)', () => {
    // N = (0, 0, 1) after normalisation: Ax = (0, 1, 0) × N = (1, 0, 0), Ay = N × Ax = (0, 1, 0).
    for (const nz of [1, 2, 1e-300, 5e-324, 1e300]) expect(getOcsMap(0, 0, nz)).toBe(IDENTITY);
    expect(getOcsMap(-0, -0, 1)).toBe(IDENTITY);
    // N = (0, 0, −1): Ax = (0, 1, 0) × N = (−1, 0, 0), Ay = N × Ax = (0, 1, 0): x is mirrored.
    expect(getOcsMap(0, 0, -1)).toMatchObject({ a: -1, b: 0, d: 1, e: 0, f: 0 });
    for (const [nx, ny, nz] of [[0, 0, 0], [0, 0, Infinity], [0, 0, Number.NaN], [1, 0, 0]]) expect(getOcsMap(nx, ny, nz)).toBeNull();
  });
});
