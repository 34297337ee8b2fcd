/**
 * 2D affine maps for DXF geometry: object coordinate systems (OCS → WCS by the arbitrary axis
 * algorithm) and block inserts. The piece store applies them exactly to every segment kind
 * (pieceStore.ts, `addSegment`).
 */
import { PLANE_NORMAL_TOLERANCE } from '../../geometry/tolerances';

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
