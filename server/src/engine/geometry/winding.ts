/**
 * Winding number of a closed contour around a point, by a ray to +x over the contour's monotone
 * pieces (each piece meets a horizontal line at most once). Line pieces are decided exactly with
 * orient2d; curved pieces by bisection on their monotone y to 1e-9 of the outline size.
 * Half-open rule y0 ≤ y < y1 so a ray through a vertex counts once. [src: the crossing-number /
 * winding-number test, e.g. O'Rourke, *Computational Geometry in C*, 2nd ed., §7.4 — from memory;
 * sign: positive for a loop turning counter-clockwise in y-up axes, as the signed area in types.ts]
 */
import { orient2d } from 'robust-predicates';
import type { Contour } from '../types';
import { buildPieces, getPiecePoint, KIND_LINE, STRIDE, type Pieces } from './intersectPieces';
import { RELATIVE_POINT_TOLERANCE } from './intersect';
import { getVectorLength } from './length';

export interface WindingResult {
  /** Signed number of turns of the contour (closed by its chord) around the point. */
  readonly winding: number;
  /** The point lies on the contour (within 1e-9 of its size), where the winding is undefined. */
  readonly onBoundary: boolean;
}

/** A reusable winding-number test for one contour (the contour is treated as closed). */
export interface WindingTester {
  readonly pieces: Pieces;
  readonly eps: number;
  getWinding(x: number, y: number): WindingResult;
}

/** Bisection steps on a monotone piece: 80 halvings take any double interval below one ulp. */
const MAX_WINDING_BISECTION_STEPS = 80;

export function createWindingTester(contour: Contour): WindingTester {
  const probe = buildPieces([contour], 0, { closeAll: true });
  const [a, b, c, d] = probe.bbox;
  const eps = probe.count > 0 ? RELATIVE_POINT_TOLERANCE * getVectorLength(c - a, d - b) : 0;
  // The pieces at tolerance eps differ from the probe only when a kept segment or gap is within eps.
  const pieces = probe.minKeptExtent > eps ? probe : buildPieces([contour], eps, { closeAll: true });
  const buf = pieces.buf;
  return {
    pieces,
    eps,
    getWinding(px: number, py: number): WindingResult {
      let w = 0;
      for (let i = 0; i < pieces.count; i++) {
        const o = i * STRIDE;
        const x0 = buf[o + 4]!, y0 = buf[o + 5]!, x1 = buf[o + 6]!, y1 = buf[o + 7]!;
        if (py < Math.min(y0, y1) - eps || py > Math.max(y0, y1) + eps) continue;
        if (px > Math.max(x0, x1) + eps && buf[o] === KIND_LINE) continue;
        if (buf[o] === KIND_LINE) {
          const s = orient2d(x0, y0, x1, y1, px, py); // < 0: point left of the edge (y-up)
          if (s === 0 && px >= Math.min(x0, x1) && px <= Math.max(x0, x1) && py >= Math.min(y0, y1) && py <= Math.max(y0, y1)) {
            return { winding: 0, onBoundary: true };
          }
          if (y0 <= py && py < y1 && s < 0) w++;
          else if (y1 <= py && py < y0 && s > 0) w--;
          continue;
        }
        // Curved monotone piece: find x at height py.
        const up = y1 > y0;
        if (!(up ? y0 <= py && py < y1 : y1 <= py && py < y0)) {
          // Still check for the point lying on the piece near its ends.
          const [ex, ey] = getPiecePoint(buf, i, Math.abs(py - y0) < Math.abs(py - y1) ? 0 : 1);
          if (getVectorLength(ex - px, ey - py) <= eps) return { winding: 0, onBoundary: true };
          continue;
        }
        let lo = 0, hi = 1;
        for (let k = 0; k < MAX_WINDING_BISECTION_STEPS && hi - lo > 0; k++) {
          const m = 0.5 * (lo + hi);
          if (m <= lo || m >= hi) break;
          const ym = getPiecePoint(buf, i, m)[1];
          if ((ym < py) === up) lo = m; else hi = m;
        }
        const [xc, yc] = getPiecePoint(buf, i, 0.5 * (lo + hi));
        if (getVectorLength(xc - px, yc - py) <= eps) return { winding: 0, onBoundary: true };
        if (xc > px) w += up ? 1 : -1;
      }
      return { winding: w, onBoundary: false };
    },
  };
}

/** Winding number of a (closed) contour around (x, y). */
export function getWindingNumber(contour: Contour, x: number, y: number): WindingResult {
  return createWindingTester(contour).getWinding(x, y);
}
