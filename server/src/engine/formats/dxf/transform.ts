/**
 * 2D affine maps for DXF geometry: object coordinate systems (OCS → WCS by the arbitrary axis
 * algorithm) and block inserts, applied exactly to every segment kind (an affine image of a Bézier is
 * the Bézier of the mapped control points; of an `Arc`, the arc with mapped centre and mapped
 * conjugate semi-diameters — types.ts).
 */
import { PLANE_NORMAL_TOLERANCE } from '../../geometry/tolerances';
import type { Segment, SourceSpan } from '../../types';

/** x' = a·x + c·y + e, y' = b·x + d·y + f. */
export interface Affine {
  readonly a: number; readonly b: number;
  readonly c: number; readonly d: number;
  readonly e: number; readonly f: number;
}

export const IDENTITY: Affine = { a: 1, b: 0, c: 0, d: 1, e: 0, f: 0 };

export function scaling(sx: number, sy: number): Affine {
  return { a: sx, b: 0, c: 0, d: sy, e: 0, f: 0 };
}

export function translation(tx: number, ty: number): Affine {
  return { a: 1, b: 0, c: 0, d: 1, e: tx, f: ty };
}

/** cos and sin of an angle in degrees, exact (0, ±1) at multiples of 90°. */
export function getCosSinDeg(deg: number): [number, number] {
  const r = ((deg % 360) + 360) % 360;
  if (r === 0) return [1, 0];
  if (r === 90) return [0, 1];
  if (r === 180) return [-1, 0];
  if (r === 270) return [0, -1];
  const t = (r * Math.PI) / 180;
  return [Math.cos(t), Math.sin(t)];
}

export function rotationDeg(deg: number): Affine {
  const [cs, sn] = getCosSinDeg(deg);
  return { a: cs, b: sn, c: -sn, d: cs, e: 0, f: 0 };
}

/** The map that applies `second` after `first`. */
export function compose(second: Affine, first: Affine): Affine {
  return {
    a: second.a * first.a + second.c * first.b,
    b: second.b * first.a + second.d * first.b,
    c: second.a * first.c + second.c * first.d,
    d: second.b * first.c + second.d * first.d,
    e: second.a * first.e + second.c * first.f + second.e,
    f: second.b * first.e + second.d * first.f + second.f,
  };
}

/** Largest factor by which the map stretches a length (largest singular value of its linear part). */
export function getMaxStretch(m: Affine): number {
  // Singular values of [[a c] [b d]]: sqrt of the eigenvalues of MᵀM.
  const p = m.a * m.a + m.b * m.b;
  const q = m.c * m.c + m.d * m.d;
  const r = m.a * m.c + m.b * m.d;
  const mean = (p + q) / 2;
  const disc = Math.sqrt(((p - q) / 2) ** 2 + r * r);
  return Math.sqrt(mean + disc);
}

/**
 * The OCS → WCS map (x, y part) of an extrusion direction N, by the arbitrary axis algorithm
 * (REFERENCES.md §6.5, DXF Reference "Arbitrary Axis Algorithm"), or null when N is not parallel to
 * ±Z (the entity leaves the drawing plane) or has zero length.
 */
export function getOcsMap(nx: number, ny: number, nz: number): Affine | null {
  // The default extrusion (0, 0, 1), and any positive multiple, is the identity (the steps below agree).
  if (nx === 0 && ny === 0 && nz > 0 && nz < Infinity) return IDENTITY;
  const len = Math.hypot(nx, ny, nz);
  if (!(len > 0) || !Number.isFinite(len)) return null;
  const x = nx / len, y = ny / len, z = nz / len;
  if (Math.abs(x) >= PLANE_NORMAL_TOLERANCE || Math.abs(y) >= PLANE_NORMAL_TOLERANCE) return null;
  if (z > 0 && x === 0 && y === 0) return IDENTITY;
  // |Nx|, |Ny| < 1/64 → Ax = normalize((0,1,0) × N) = normalize((z, 0, −x)); Ay = N × Ax.
  const axLen = Math.hypot(z, x);
  const ax = [z / axLen, 0, -x / axLen];
  const ay = [y * ax[2] - z * ax[1], z * ax[0] - x * ax[2], x * ax[1] - y * ax[0]];
  const ayLen = Math.hypot(ay[0], ay[1], ay[2]);
  // WCS = x·Ax + y·Ay (+ z·N, whose x and y parts are below the tolerance and dropped).
  return { a: ax[0], b: ax[1], c: ay[0] / ayLen, d: ay[1] / ayLen, e: 0, f: 0 };
}

export function mapPoint(m: Affine, x: number, y: number): [number, number] {
  return [m.a * x + m.c * y + m.e, m.b * x + m.d * y + m.f];
}

/** The image of a segment under an affine map, with the given span. */
export function mapSegment(m: Affine, s: Segment, span: SourceSpan = s.span): Segment {
  const px = (x: number, y: number) => m.a * x + m.c * y + m.e;
  const py = (x: number, y: number) => m.b * x + m.d * y + m.f;
  switch (s.kind) {
    case 'line':
      return { kind: 'line', x0: px(s.x0, s.y0), y0: py(s.x0, s.y0), x1: px(s.x1, s.y1), y1: py(s.x1, s.y1), span };
    case 'quad':
      return {
        kind: 'quad', x0: px(s.x0, s.y0), y0: py(s.x0, s.y0), x1: px(s.x1, s.y1), y1: py(s.x1, s.y1),
        x2: px(s.x2, s.y2), y2: py(s.x2, s.y2), span,
      };
    case 'cubic':
      return {
        kind: 'cubic', x0: px(s.x0, s.y0), y0: py(s.x0, s.y0), x1: px(s.x1, s.y1), y1: py(s.x1, s.y1),
        x2: px(s.x2, s.y2), y2: py(s.x2, s.y2), x3: px(s.x3, s.y3), y3: py(s.x3, s.y3), span,
      };
    case 'arc':
      return {
        kind: 'arc',
        x0: px(s.x0, s.y0), y0: py(s.x0, s.y0), x1: px(s.x1, s.y1), y1: py(s.x1, s.y1),
        cx: px(s.cx, s.cy), cy: py(s.cx, s.cy),
        ux: m.a * s.ux + m.c * s.uy, uy: m.b * s.ux + m.d * s.uy,
        vx: m.a * s.vx + m.c * s.vy, vy: m.b * s.vx + m.d * s.vy,
        theta0: s.theta0, sweep: s.sweep, span,
      };
  }
}
