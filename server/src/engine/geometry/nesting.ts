/**
 * Which closed contours lie inside which (even-odd depth), parts (an outer boundary with its holes),
 * net material area per part, orientation consistency, and the file summary.
 *
 * A contour's position is decided from one sample point on it (the midpoint of its first piece that
 * is not on the other contour) by the exact winding number of every other closed contour around it
 * (winding.ts); "inside" is an odd winding number (even-odd rule, SVG 2 `fill-rule: evenodd`).
 * Candidate containers come from a flatbush index of contour boxes. [common practice, no source]
 */
import Flatbush from 'flatbush';
import type { FileSummary, MeasuredContour, Part } from '../types';
import { getPiecePoint } from './intersectPieces';
import { getSegmentCount } from '../model/packedSegment';
import { createWindingTester, type WindingTester } from './winding';

/**
 * Most winding-number tests of one file (each a few microseconds for a curved contour): contours
 * stacked on one another (each sample point on every other's boundary) or nested all in all make the
 * tests grow with the square of their count. A thousand concentric circles need about 650 000
 * (measured). Past the limit, the contour being placed and those after it are left at depth 0, and
 * `stoppedAt` says so (the `search-stopped` check). Source: common practice, no source.
 */
export const MAX_WINDING_TESTS = 1_000_000;

export interface Nesting {
  /**
   * Null when every contour was placed; otherwise the position of the contour at which
   * MAX_WINDING_TESTS stopped the tests: it and the later ones may lie inside others and are not known to.
   */
  readonly stoppedAt: number | null;
  /** Per contour (by position): index of the innermost closed contour containing it, or null. */
  readonly parent: readonly (number | null)[];
  /** Per contour: number of closed contours containing it (even = material boundary, odd = hole). */
  readonly depth: readonly number[];
  readonly parts: readonly Part[];
}

function samplePoints(t: WindingTester): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < t.pieces.count && out.length < 8; i++) out.push(getPiecePoint(t.pieces.buf, i, 0.5));
  return out;
}

export function getNesting(contours: readonly MeasuredContour[]): Nesting {
  const n = contours.length;
  // Testers are built on first use: a contour whose box meets no other closed contour's box needs none.
  const testers: (WindingTester | undefined)[] = new Array(n);
  const tester = (i: number) => (testers[i] ??= createWindingTester(contours[i]!.contour));
  // Positions of the closed contours with something drawn, in order: the only containers, holes and outer boundaries.
  const indexed: number[] = [];
  for (let i = 0; i < n; i++) {
    const c = contours[i]!;
    if (c.metrics.closed && getSegmentCount(c.contour) > 0) indexed.push(i);
  }
  const parent: (number | null)[] = new Array(n).fill(null);
  const depth: number[] = new Array(n).fill(0);
  if (indexed.length === 0) return { stoppedAt: null, parent, depth, parts: [] };
  const tree = new Flatbush(indexed.length);
  for (const i of indexed) {
    const [a, b, c, d] = contours[i]!.metrics.bboxMm;
    tree.add(a, b, c, d);
  }
  tree.finish();
  const area = (i: number) => contours[i]!.metrics.areaMm2.value ?? 0;
  let tests = 0;
  let stoppedAt: number | null = null;
  for (let i = 0; i < n && stoppedAt === null; i++) {
    const [minX, minY, maxX, maxY] = contours[i]!.metrics.bboxMm;
    if (tree.search(minX, minY, maxX, maxY).every((k) => indexed[k] === i)) continue;
    const samples = samplePoints(tester(i));
    if (samples.length === 0) continue;
    const [sx, sy] = samples[0]!;
    for (const k of tree.search(sx, sy, sx, sy)) {
      const j = indexed[k]!;
      if (j === i) continue;
      if (tests + samples.length > MAX_WINDING_TESTS) {
        stoppedAt = i;
        depth[i] = 0;
        parent[i] = null;
        break;
      }
      let inside: boolean | null = null;
      for (const [x, y] of samples) {
        tests++;
        const r = tester(j).getWinding(x, y);
        if (!r.onBoundary) {
          inside = Math.abs(r.winding) % 2 === 1;
          break;
        }
      }
      if (!inside) continue;
      depth[i]!++;
      const p = parent[i];
      if (p === null || p === undefined || area(j) < area(p)) parent[i] = j;
    }
  }
  // Holes per outer boundary, in contour order, gathered in one pass.
  const holesOf = new Map<number, number[]>();
  for (const k of indexed) {
    const p = parent[k];
    if (depth[k]! % 2 !== 1 || p === null || p === undefined) continue;
    const list = holesOf.get(p);
    if (list) list.push(k);
    else holesOf.set(p, [k]);
  }
  const parts: Part[] = [];
  for (const i of indexed) {
    if (depth[i]! % 2 !== 0) continue;
    const holes = holesOf.get(i) ?? [];
    const o = contours[i]!.metrics.orientation;
    const orientations = holes.map((h) => contours[h]!.metrics.orientation);
    const consistent = o === null || orientations.some((h) => h === null) ? null : orientations.every((h) => h !== o);
    parts.push({
      outer: contours[i]!.contour.index,
      holes: holes.map((h) => contours[h]!.contour.index),
      netAreaMm2: area(i) - holes.reduce((s, h) => s + area(h), 0),
      holesTurnOpposite: consistent,
    });
  }
  // Positions to contour indices, in place.
  for (let i = 0; i < n; i++) {
    const p = parent[i];
    if (p !== null && p !== undefined) parent[i] = contours[p]!.contour.index;
  }
  return { stoppedAt, parent, depth, parts };
}

export function getFileSummary(contours: readonly MeasuredContour[], nesting: Nesting = getNesting(contours)): FileSummary {
  let pierces = 0, cutLengthMm = 0;
  for (let i = 0; i < contours.length; i++) {
    const c = contours[i]!;
    if (getSegmentCount(c.contour) > 0) pierces++;
    cutLengthMm += c.metrics.lengthMm;
  }
  return {
    contours: contours.length,
    parts: nesting.parts.length,
    pierces,
    cutLengthMm,
    netAreaMm2: nesting.parts.reduce((s, p) => s + p.netAreaMm2, 0),
  };
}
