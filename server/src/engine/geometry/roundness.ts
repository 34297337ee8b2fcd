/**
 * Roundness of a closed contour (REFERENCES.md §1.2–1.4, §3):
 * - circumradius R: smallest enclosing circle of the hull vertices, Welzl's algorithm (§3.3);
 * - inradius ρ: largest circle inside the contour, by best-first branch and bound over square cells
 *   of the signed distance to the outline (1-Lipschitz, so a cell of half-diagonal h around a centre
 *   with distance d holds nothing above d + h) [common practice, no source; the same bound drives the
 *   "pole of inaccessibility" search], tightened to the maximum over the cell of the least of linear
 *   upper bounds of the nearest pieces' distances (a 2D linear programme, solved exactly by its
 *   vertices), which is exact where the distance is linear, so plateaus such as a rectangle's close
 *   at once;
 * - minimum-zone roundness t_MZ (ISO 12181, §3.1): the least radial separation of two concentric
 *   circles enclosing the outline. F(c) = max|c − p| − min dist(c, outline) is 2-Lipschitz in c, so
 *   branch and bound over cells gives the global minimum over the search region to a tolerance;
 *   cells are also bounded by pairing those linear bounds with tangent bounds of the farthest
 *   distance, with the concave curvature of both kept (a concave quadratic, maximised exactly), which
 *   closes ridges such as a crescent's axis. The search stops at the tolerance; MAX_ROUNDNESS_CELLS
 *   is a safety cap whose gap would be the stated bound. The region is the smallest enclosing disc,
 *   as §3.4 asks ("elongated shapes have no finite MZ centre"); the result says when the best centre
 *   lies on the region's rim.
 * - Bonnesen: R − ρ ≤ √D/π (§1.2–1.3); Banchoff–Pohl: L² ≥ 4π∬w² dA (§1.4), with ∬w² dA computed
 *   exactly on the polyline by horizontal slabs (between consecutive vertex/crossing heights every
 *   crossing x is linear in y, so the slab's ∫w² dx is linear and its midpoint value is exact).
 * Curved outlines are flattened within δ (hull.ts), once per contour for the hull, R and the searches;
 * the searches keep arcs of circles exact and use the chords of everything else, reduced to at most
 * MAX_ROUNDNESS_PIECES pieces on finely divided contours (simplify.ts, which adds the distance it moves
 * them to δ). Max and min distances then move by ≤ δ (the searches' δ counts only flattened and
 * reduced pieces), so R and ρ carry ±δ and t_MZ ±2δ on top of the search tolerance; both are in the
 * stated error bound.
 */
import Flatbush from 'flatbush';
import type { Contour, ContourHull, ContourMetrics, ContourRoundness, ContourShape, Measured, MeasuredCircle } from '../types';
import { getContourCircle } from './circleContour';
import { getConvexContourHull } from './convexContour';
import { findSelfIntersections } from './intersect';
import { getArcCircle, getContourHullMeasures, getPolylineHull, getTransientPolyline, type HullMeasures, type Polyline } from './hull';
import { getVectorLength } from './length';
import { distToSegment, simplifyClosedPolyline } from './simplify';
import { keepShape } from '../keepShape';
import { getSegmentAt, SegmentView } from '../model/packedSegment';

/** Search tolerance of the branch and bound, relative to the outline's size (bbox diagonal). */
export const ROUNDNESS_RELATIVE_TOLERANCE = 1e-8;
/** Flattening tolerance for curves, relative to the outline's size (bbox diagonal): 1 µm on a 100 mm
 *  part, far below a kerf, and part of every stated error bound. 1e-6 gave a 10 mm slot ~1130 vertices
 *  instead of ~360 and made the sample files' roundness ~2× slower. [common practice, no source] */
export const ROUNDNESS_FLATTENING_RELATIVE = 1e-5;
/** Most cells evaluated by one branch-and-bound search; the bound reached is reported if hit. */
export const MAX_ROUNDNESS_CELLS = 2000;
/** Most polyline vertices for the slab integral ∬w² dA (one slab per vertex height, each visiting the
 *  edges it meets: quadratic for outlines that wind many times). */
export const MAX_WINDING_INTEGRAL_VERTICES = 20000;
/** Most search pieces (lines, chords of flattened curves, arcs of circles) for the inradius and
 *  minimum-zone searches. Each of their ≤ MAX_ROUNDNESS_CELLS cells finds its nearest and farthest
 *  pieces in a chord tree, but near a medial axis many pieces are almost equally far, so a cell still
 *  visits a share of them growing with the piece count. A contour with more has its chords reduced to
 *  this many (simplify.ts), and the distance that moves them joins the stated error bounds (a
 *  tessellated circle of radius R needs about 4R(1 − cos(π/2000)) ≈ 5e-6·R); only when the
 *  reduction's work cap is reached are those figures undefined with the reason. */
export const MAX_ROUNDNESS_PIECES = 2000;

type Pt = readonly [number, number];

export interface Circle { readonly x: number; readonly y: number; readonly r: number }

// ---------------------------------------------------------------- smallest enclosing circle

function circleFrom2(a: Pt, b: Pt): Circle {
  const x = (a[0] + b[0]) / 2, y = (a[1] + b[1]) / 2;
  return { x, y, r: getVectorLength(a[0] - x, a[1] - y) };
}

function circleFrom3(a: Pt, b: Pt, c: Pt): Circle | null {
  const bx = b[0] - a[0], by = b[1] - a[1], cx = c[0] - a[0], cy = c[1] - a[1];
  const d = 2 * (bx * cy - by * cx);
  if (d === 0) return null;
  const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
  const ux = (cy * b2 - by * c2) / d, uy = (bx * c2 - cx * b2) / d;
  return { x: a[0] + ux, y: a[1] + uy, r: getVectorLength(ux, uy) };
}

/**
 * |p − C| ≤ r(1 + 1e-14) + 1e-300 with |p − C| as Math.hypot gives it. The squared distance decides
 * first wherever it is off the bound by more than 1e-12 relative (far beyond the few ulp between
 * them, and where the squares neither overflow nor vanish); only the rest takes getVectorLength
 * (Math.hypot's value, at a division and a square root).
 */
function inCircle(c: Circle, p: Pt): boolean {
  const dx = p[0] - c.x, dy = p[1] - c.y, bound = c.r * (1 + 1e-14) + 1e-300;
  const d2 = dx * dx + dy * dy, b2 = bound * bound;
  if (d2 < b2 * (1 - 1e-12)) return true;
  if (d2 > b2 * (1 + 1e-12) && b2 > 0) return false;
  return getVectorLength(dx, dy) <= bound;
}

/** Smallest enclosing circle (Welzl 1991, iterative move-to-front form; deterministic shuffle). */
export function getSmallestEnclosingCircle(points: readonly Pt[]): Circle {
  const p = [...points];
  let seed = 12345;
  for (let i = p.length - 1; i > 0; i--) {
    seed = (seed * 1103515245 + 12345) & 0x7fffffff;
    const j = seed % (i + 1);
    [p[i], p[j]] = [p[j]!, p[i]!];
  }
  if (p.length === 0) return { x: 0, y: 0, r: 0 };
  let c: Circle = { x: p[0]![0], y: p[0]![1], r: 0 };
  for (let i = 1; i < p.length; i++) {
    if (inCircle(c, p[i]!)) continue;
    c = { x: p[i]![0], y: p[i]![1], r: 0 };
    for (let j = 0; j < i; j++) {
      if (inCircle(c, p[j]!)) continue;
      c = circleFrom2(p[i]!, p[j]!);
      for (let k = 0; k < j; k++) {
        if (inCircle(c, p[k]!)) continue;
        c = circleFrom3(p[i]!, p[j]!, p[k]!) ?? c;
      }
    }
  }
  return c;
}

// ---------------------------------------------------------------- the outline searched

/**
 * One piece of the outline as the searches see it: a line segment from A to B (A = B for a point of
 * a point set), or an arc of a circle (centre C, radius r) over the sector from the directions of A
 * to B, plus the end points A and B themselves. Circle pieces come from monotone arc pieces, so their
 * sector is at most a quarter turn; `ccw` says whether A → B turns counter-clockwise (y-up).
 */
export interface SearchPiece {
  readonly ax: number; readonly ay: number; readonly bx: number; readonly by: number;
  readonly circle: {
    readonly cx: number; readonly cy: number; readonly r: number; readonly ccw: boolean;
    /** Ends of the piece joined with the next piece on the same circle (a sector of at most a half
     *  turn): distance bounds may use it, the distance to the pair being at most that to the piece. */
    readonly span: readonly [number, number, number, number];
  } | null;
}

/** The outline as search pieces, and the largest distance between it and the contour (δ). */
export interface SearchOutline {
  readonly pieces: readonly SearchPiece[];
  readonly deviationMm: number;
}

/** A closed polyline (or, with `asPoints`, a point set) as search pieces. */
function outlineFromPoints(points: readonly Pt[], asPoints = false): SearchOutline {
  const n = points.length;
  return {
    pieces: points.map((a, i) => {
      const b = asPoints ? a : points[(i + 1) % n]!;
      return { ax: a[0], ay: a[1], bx: b[0], by: b[1], circle: null };
    }),
    deviationMm: 0,
  };
}

/** How many search pieces `outlineFromPolyline` makes: one per circle piece, one per chord of the others. */
function countSearchPieces(poly: Polyline): number {
  const first = poly.pieceFirst, pieces = first.length;
  let count = 0;
  for (let k = 0; k < pieces; k++) count += poly.pieceOnCircle[k] ? 1 : (k + 1 < pieces ? first[k + 1]! : poly.xs.length) - first[k]!;
  return count;
}

/** The segment outlineFromPolyline asks for its circle, for a contour whose segments are stored. */
const circleView = new SegmentView();

/**
 * A flattened contour as search pieces: arcs of circles stay exact arcs (their chords are dropped),
 * everything else is its chords. δ is the largest deviation of a flattened piece or of an arc from
 * its circle, so distances to the outline are within ±δ of distances to the contour. With `reduced`,
 * only the vertices it keeps start chords, each running to the next kept vertex, and its deviation
 * adds to that of the flattened pieces (the reduced chords lie within it of the flattened ones);
 * when it reduced circle pieces too, they are chords like the rest.
 */
function outlineFromPolyline(poly: Polyline, contour: Contour, toleranceMm: number, reduced?: ReducedVertices): SearchOutline {
  const { xs, ys, pieceFirst } = poly, n = xs.length, count = pieceFirst.length;
  const pieces: SearchPiece[] = [];
  const circles = reduced?.circles ?? true;
  let deviation = (circles ? poly.offCircleDeviationMm : poly.deviationMm) + (reduced?.deviationMm ?? 0);
  const keep = reduced?.keep;
  let next: Int32Array | null = null;
  if (keep) {
    // The next kept vertex after each vertex, cyclically (two passes backwards).
    next = new Int32Array(n);
    let k = -1;
    for (let pass = 0; pass < 2; pass++) for (let i = n - 1; i >= 0; i--) { next[i] = k; if (keep[i]) k = i; }
  }
  const endOf = (k: number) => (k + 1 < count ? pieceFirst[k + 1]! : n);
  const circleOf = (k: number) => (circles && poly.pieceOnCircle[k] ? getArcCircle(getSegmentAt(contour, poly.pieceSegment[k]!, circleView), toleranceMm) : null);
  for (let k = 0; k < count; k++) {
    const end = endOf(k), first = pieceFirst[k]!;
    const ax = xs[first]!, ay = ys[first]!, bx = xs[end % n]!, by = ys[end % n]!;
    const c = circleOf(k);
    if (c) {
      deviation = Math.max(deviation, c.deviationMm);
      const ccw = (ax - c.cx) * (by - c.cy) - (ay - c.cy) * (bx - c.cx) > 0;
      const j = (k + 1) % count;
      const nc = circleOf(j);
      const span: [number, number, number, number] = [ax, ay, bx, by];
      if (j !== k && nc && nc.cx === c.cx && nc.cy === c.cy && nc.r === c.r) {
        const e = endOf(j) % n, ex = xs[e]!, ey = ys[e]!;
        if (((bx - c.cx) * (ey - c.cy) - (by - c.cy) * (ex - c.cx) > 0) === ccw) { span[2] = ex; span[3] = ey; }
      }
      pieces.push({ ax, ay, bx, by, circle: { cx: c.cx, cy: c.cy, r: c.r, ccw, span } });
      continue;
    }
    for (let i = first; i < end; i++) {
      if (keep && !keep[i]) continue;
      const i1 = next ? next[i]! : (i + 1) % n;
      pieces.push({ ax: xs[i]!, ay: ys[i]!, bx: xs[i1]!, by: ys[i1]!, circle: null });
    }
  }
  return { pieces, deviationMm: deviation };
}

/** Which vertices of a polyline a reduced outline keeps (1 = kept), whether its circle pieces stay
 *  circles, and the distance it moved the chords. */
interface ReducedVertices {
  readonly keep: Uint8Array;
  readonly circles: boolean;
  readonly deviationMm: number;
}

/**
 * The polyline's chords reduced so that the search sees at most `maxPieces` pieces (simplify.ts):
 * the ends of circle pieces stay (each circle piece stays one search piece) and chord vertices between
 * them may go; when those ends alone are too many (a contour of many short arcs), the circle pieces'
 * chords are reduced with the rest. Null when neither can be done (see `simplifyClosedPolyline`).
 */
function reduceVertices(poly: Polyline, maxPieces: number): ReducedVertices | null {
  return reduceWith(poly, maxPieces, true) ?? reduceWith(poly, maxPieces, false);
}

function reduceWith(poly: Polyline, maxPieces: number, circles: boolean): ReducedVertices | null {
  const { xs, ys, pieceFirst } = poly, n = xs.length, count = pieceFirst.length;
  // Per vertex: 1 = the end of a circle piece (fixed), 2 = inside a circle piece (not a chord vertex).
  const role = new Uint8Array(n);
  for (let k = 0; circles && k < count; k++) {
    if (!poly.pieceOnCircle[k]) continue;
    const first = pieceFirst[k]!, end = k + 1 < count ? pieceFirst[k + 1]! : n;
    for (let i = first + 1; i < end; i++) role[i] = 2;
    role[first] = 1;
    role[end % n] = 1;
  }
  let m = 0;
  for (let i = 0; i < n; i++) if (role[i] !== 2) m++;
  const order = new Int32Array(m), fixed = new Uint8Array(m);
  for (let i = 0, k = 0; i < n; i++) if (role[i] !== 2) { order[k] = i; fixed[k++] = role[i]!; }
  const s = simplifyClosedPolyline(xs, ys, order, fixed, maxPieces);
  if (!s) return null;
  const keep = new Uint8Array(n);
  for (let k = 0; k < m; k++) keep[order[k]!] = s.keep[k]!;
  return { keep, circles, deviationMm: s.deviationMm };
}

/** Whether the direction (dx, dy) from a circle piece's centre lies in its sector. */
function inSector(p: SearchPiece, dx: number, dy: number, ax = p.ax, ay = p.ay, bx = p.bx, by = p.by): boolean {
  const c = p.circle!;
  const sx = (c.ccw ? ax : bx) - c.cx, sy = (c.ccw ? ay : by) - c.cy;
  const ex = (c.ccw ? bx : ax) - c.cx, ey = (c.ccw ? by : ay) - c.cy;
  return sx * dy - sy * dx >= 0 && dx * ey - dy * ex >= 0;
}

/** Whether the direction lies in the piece's span (its sector joined with the next one's). */
const inSpan = (p: SearchPiece, dx: number, dy: number) => { const s = p.circle!.span; return inSector(p, dx, dy, s[0], s[1], s[2], s[3]); };

function pieceBox(p: SearchPiece): [number, number, number, number] {
  let minX = Math.min(p.ax, p.bx), minY = Math.min(p.ay, p.by), maxX = Math.max(p.ax, p.bx), maxY = Math.max(p.ay, p.by);
  const c = p.circle;
  if (c) {
    // The arc's own ends and any axis-extreme point of the circle inside the sector.
    const ends: [number, number][] = [];
    for (const [dx, dy] of [[p.ax - c.cx, p.ay - c.cy], [p.bx - c.cx, p.by - c.cy]] as const) {
      const l = getVectorLength(dx, dy);
      if (l > 0) ends.push([c.cx + (c.r * dx) / l, c.cy + (c.r * dy) / l]);
    }
    for (const [dx, dy] of [[1, 0], [0, 1], [-1, 0], [0, -1]] as const) if (inSector(p, dx, dy)) ends.push([c.cx + c.r * dx, c.cy + c.r * dy]);
    for (const [x, y] of ends) { minX = Math.min(minX, x); minY = Math.min(minY, y); maxX = Math.max(maxX, x); maxY = Math.max(maxY, y); }
  }
  return [minX, minY, maxX, maxY];
}

/** √(x² + y²); Math.hypot guards against overflow, which mm-sized outlines never reach, at several times the cost. */
const len = (x: number, y: number) => Math.sqrt(x * x + y * y);

function distToPiece(p: SearchPiece, x: number, y: number): number {
  const c = p.circle;
  if (!c) return distToSegment(x, y, p.ax, p.ay, p.bx, p.by);
  const dx = x - c.cx, dy = y - c.cy;
  const ends = Math.min(len(x - p.ax, y - p.ay), len(x - p.bx, y - p.by));
  return (dx !== 0 || dy !== 0) && inSector(p, dx, dy) ? Math.min(ends, Math.abs(len(dx, dy) - c.r)) : ends;
}

/** The largest distance from (x, y) to the piece. */
function farthestDistance(p: SearchPiece, x: number, y: number): number {
  const ends = Math.max(len(x - p.ax, y - p.ay), len(x - p.bx, y - p.by));
  const c = p.circle;
  if (!c) return ends;
  const dx = c.cx - x, dy = c.cy - y;
  return (dx !== 0 || dy !== 0) && inSector(p, dx, dy) ? Math.max(ends, len(dx, dy) + c.r) : ends;
}

/** The farthest point of the piece from (x, y): [distance, px, py]. */
function farthestOnPiece(p: SearchPiece, x: number, y: number): [number, number, number] {
  const da = len(x - p.ax, y - p.ay), db = len(x - p.bx, y - p.by);
  const ends: [number, number, number] = da >= db ? [da, p.ax, p.ay] : [db, p.bx, p.by];
  const c = p.circle;
  if (!c) return ends;
  const dx = c.cx - x, dy = c.cy - y, l = len(dx, dy);
  if (l === 0 || !inSector(p, dx, dy) || l + c.r <= ends[0]) return ends;
  return [l + c.r, c.cx + (c.r * dx) / l, c.cy + (c.r * dy) / l];
}

/** x where the piece crosses the height y, when it does (half-open in y, so shared ends count once). */
function crossingX(p: SearchPiece, y: number): number | null {
  if ((p.ay > y) === (p.by > y)) return null;
  const c = p.circle;
  if (!c) return p.ax + ((y - p.ay) * (p.bx - p.ax)) / (p.by - p.ay);
  // A circle piece is monotone, so it lies on one side of its centre's vertical.
  const side = Math.sign(p.ax + p.bx - 2 * c.cx);
  const x = c.cx + side * Math.sqrt(Math.max(0, c.r * c.r - (y - c.cy) ** 2));
  return Math.min(Math.max(x, Math.min(p.ax, p.bx)), Math.max(p.ax, p.bx));
}

/**
 * A linear function g ≥ |p − V| over the square cell (centre x, y, half-side h), for a point V at
 * distance D from the centre: with u the unit vector from V to the centre and y = p − V,
 * |y| = √((u·y)² + |y⊥|²) ≤ u·y + |y⊥|²/(2 u·y), where over the cell |y⊥| ≤ w and u·y ≥ D − w for
 * w = h(|uₓ| + |u_y|), the cell's half-width across and along u. Needs D > w.
 */
function pointUpperBound(vx: number, vy: number, x: number, y: number, h: number): [number, number, number] | null {
  const D = len(x - vx, y - vy);
  if (D === 0) return null;
  const ux = (x - vx) / D, uy = (y - vy) / D, w = h * (Math.abs(ux) + Math.abs(uy));
  if (D <= w) return null;
  return [ux, uy, -(ux * vx + uy * vy) + (w * w) / (2 * (D - w))];
}

/**
 * An upper bound over a cell (centre x₀): a·x + b·y + c − β((x − x₀)·(px, py))², β ≥ 0. The
 * quadratic term records the curvature of a concave distance (β = 0 when there is none to use).
 */
type Bound = [number, number, number, number, number, number];

/**
 * The β of −|p − V| over a cell, for V at distance D from the centre along the unit vector u:
 * |y| − u·y = |y⊥|²/(|y| + u·y) ≥ |y⊥|²/(2(D + w)), w = h(|uₓ| + |u_y|), and y⊥ = e·u⊥ for the
 * offset e from the centre.
 */
const concavity = (D: number, ux: number, uy: number, h: number) => 1 / (2 * (D + h * (Math.abs(ux) + Math.abs(uy))));

/**
 * max over e ∈ [−h, h]² of k + g·e − eᵀMe for positive semi-definite M (sum of β·a·aᵀ), exact: a
 * concave function on a square peaks at its stationary point if that lies inside, else on a side,
 * where it is a concave parabola peaking at its clamped vertex. A singular M leaves a maximiser on
 * the boundary as well.
 */
function maxConcaveQuadratic(k: number, gx: number, gy: number, m11: number, m12: number, m22: number, h: number): number {
  let best = -Infinity;
  for (let side = -h, k2 = 0; k2 < 2; k2++, side = h) {
    best = Math.max(best,
      quadraticAt(k, gx, gy, m11, m12, m22, side, clampedVertex(gy - 2 * m12 * side, m22, h)),
      quadraticAt(k, gx, gy, m11, m12, m22, clampedVertex(gx - 2 * m12 * side, m11, h), side));
  }
  const det = m11 * m22 - m12 * m12;
  if (det > 1e-12 * m11 * m22) {
    const ex = (m22 * gx - m12 * gy) / (2 * det), ey = (m11 * gy - m12 * gx) / (2 * det);
    if (Math.abs(ex) <= h && Math.abs(ey) <= h) best = Math.max(best, quadraticAt(k, gx, gy, m11, m12, m22, ex, ey));
  }
  return best;
}

/** k + g·e − eᵀMe at e = (ex, ey). */
const quadraticAt = (k: number, gx: number, gy: number, m11: number, m12: number, m22: number, ex: number, ey: number) =>
  k + gx * ex + gy * ey - (m11 * ex * ex + 2 * m12 * ex * ey + m22 * ey * ey);

/** The vertex of the parabola lin·t − quad·t² on [−h, h] (an end when it is linear). */
const clampedVertex = (lin: number, quad: number, h: number) => (quad > 0 ? Math.min(h, Math.max(-h, lin / (2 * quad))) : lin >= 0 ? h : -h);

/**
 * A linear function g ≥ the distance to the piece over the square cell (centre x, y, half-side h):
 * for a segment, if the whole cell projects inside it on one side, the distance is linear there;
 * for a circle piece, if the whole cell is inside the circle and in the sector, the distance is
 * r − |p − C| there, below its tangent plane at the cell's centre (Cauchy–Schwarz); if it is wholly
 * outside the disc and in the sector, |p − C| − r, bounded by `pointUpperBound` for C. Testing the
 * corners suffices for the strip, half-plane, disc and sector (≤ a quarter turn), which are convex.
 */
function linearUpperBound(p: SearchPiece, x: number, y: number, h: number): Bound | null {
  const c = p.circle;
  let valid = true;
  if (!c) {
    const dx = p.bx - p.ax, dy = p.by - p.ay, l = len(dx, dy);
    let sign = 0;
    for (let k = 0; k < 4 && l > 0; k++) {
      const qx = x + (k & 1 ? h : -h) - p.ax, qy = y + (k & 2 ? h : -h) - p.ay;
      const t = (qx * dx + qy * dy) / (l * l);
      const s = Math.sign(dx * qy - dy * qx);
      if (t < 0 || t > 1 || (s !== 0 && sign !== 0 && s !== sign)) { valid = false; break; }
      if (s !== 0) sign = s;
    }
    if (l > 0 && valid) {
      const a = ((sign || 1) * -dy) / l, b = ((sign || 1) * dx) / l;
      return [a, b, -(a * p.ax + b * p.ay), 0, 0, 0];
    }
  } else {
    let inCircle = 0;
    for (let k = 0; k < 4; k++) {
      const dx = x + (k & 1 ? h : -h) - c.cx, dy = y + (k & 2 ? h : -h) - c.cy;
      if (!inSpan(p, dx, dy)) { valid = false; break; }
      if (len(dx, dy) <= c.r) inCircle++;
    }
    const l = len(x - c.cx, y - c.cy);
    if (valid && inCircle === 4 && l > 0) {
      const ux = (x - c.cx) / l, uy = (y - c.cy) / l;
      return [-ux, -uy, c.r + ux * c.cx + uy * c.cy, concavity(l, ux, uy, h), -uy, ux];
    }
    if (valid && len(Math.max(0, Math.abs(x - c.cx) - h), Math.max(0, Math.abs(y - c.cy) - h)) >= c.r) {
      // The whole cell is outside the disc: the distance is |p − C| − r.
      const g = pointUpperBound(c.cx, c.cy, x, y, h);
      if (g) return [g[0], g[1], g[2] - c.r, 0, 0, 0];
    }
  }
  const aNearer = len(x - p.ax, y - p.ay) <= len(x - p.bx, y - p.by);
  const g = aNearer ? pointUpperBound(p.ax, p.ay, x, y, h) : pointUpperBound(p.bx, p.by, x, y, h);
  return g && [g[0], g[1], g[2], 0, 0, 0];
}

/**
 * A linear g ≥ dist(p, inner) − farthest(p) over the cell when `inner` is a circle piece (centre C₂,
 * radius r₂) with the cell wholly outside its disc and in its sector, and `outer` a circle piece
 * (C₁, r₁) whose farthest point from every point of the cell lies in its sector, so the difference
 * is |y₂| − r₂ − |y₁| − r₁ (yᵢ = p − Cᵢ). With uᵢ the unit vector from Cᵢ to the centre, e the offset
 * from the centre, wᵢ = h‖uᵢ‖₁ and aᵢ = uᵢ⊥ (signs matched): |y₂| ≤ u₂·y₂ + (e·a₂)²/(2(D₂ − w₂)) and
 * |y₁| ≥ u₁·y₁ + (e·a₁)²/(2(D₁ + w₁)); with α, β those two factors, α(e·a₂)² − β(e·a₁)² ≤
 * max(0, α − β)·w₂² + β·h²‖a₂ − a₁‖₁‖a₂ + a₁‖₁. The curvatures cancel where the two centres line up
 * with the cell, so a ridge of the zone width (a crescent's axis) closes instead of being split
 * into ever smaller cells.
 */
function circleGapUpperBound(inner: SearchPiece, outer: SearchPiece, x: number, y: number, h: number): [number, number, number] | null {
  const c2 = inner.circle, c1 = outer.circle;
  if (!c2 || !c1 || inner === outer) return null;
  if (len(Math.max(0, Math.abs(x - c2.cx) - h), Math.max(0, Math.abs(y - c2.cy) - h)) < c2.r) return null;
  for (let k = 0; k < 4; k++) {
    const px = x + (k & 1 ? h : -h), py = y + (k & 2 ? h : -h);
    if (!inSpan(inner, px - c2.cx, py - c2.cy) || !inSpan(outer, c1.cx - px, c1.cy - py)) return null;
  }
  const D2 = len(x - c2.cx, y - c2.cy), D1 = len(x - c1.cx, y - c1.cy);
  if (D2 === 0 || D1 === 0) return null;
  const u2x = (x - c2.cx) / D2, u2y = (y - c2.cy) / D2, u1x = (x - c1.cx) / D1, u1y = (y - c1.cy) / D1;
  const w2 = h * (Math.abs(u2x) + Math.abs(u2y)), w1 = h * (Math.abs(u1x) + Math.abs(u1y));
  if (D2 <= w2) return null;
  const alpha = 1 / (2 * (D2 - w2)), beta = 1 / (2 * (D1 + w1));
  const s = u1x * u2x + u1y * u2y >= 0 ? 1 : -1;
  const diff = Math.abs(u2y - s * u1y) + Math.abs(u2x - s * u1x), sum = Math.abs(u2y + s * u1y) + Math.abs(u2x + s * u1x);
  const rem = Math.max(0, alpha - beta) * w2 * w2 + beta * h * h * diff * sum;
  return [u2x - u1x, u2y - u1y, -(u2x * c2.cx + u2y * c2.cy) + u1x * c1.cx + u1y * c1.cy - c2.r - c1.r + rem];
}

/**
 * max over the square (centre x0, y0, half-side h) of min_k g_k, exact: the maximum of this 2D
 * linear programme lies at a vertex, where two of {box sides, g_i = g_j} or three g are tight, and
 * every such point is tried (points just outside the box only raise the answer, which stays an
 * upper bound). g_k(x, y) = rows[3k]·x + rows[3k + 1]·y + rows[3k + 2], k < m.
 */
let lpA = new Float64Array(16), lpB = new Float64Array(16), lpC = new Float64Array(16);
function maxOfMinLinear(rows: Float64Array, m: number, x0: number, y0: number, h: number): number {
  // Coordinates relative to the cell's centre: g(x0 + u, y0 + v) = a u + b v + (a x0 + b y0 + c).
  if (lpA.length < m) { lpA = new Float64Array(2 * m); lpB = new Float64Array(2 * m); lpC = new Float64Array(2 * m); }
  const A = lpA, B = lpB, C = lpC;
  for (let i = 0; i < m; i++) { A[i] = rows[3 * i]!; B[i] = rows[3 * i + 1]!; C[i] = rows[3 * i]! * x0 + rows[3 * i + 1]! * y0 + rows[3 * i + 2]!; }
  const lim = h * (1 + 1e-9);
  let best = -Infinity;
  best = lpTry(-h, -h, best, m, lim); best = lpTry(h, -h, best, m, lim); best = lpTry(-h, h, best, m, lim); best = lpTry(h, h, best, m, lim);
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      const da = A[i]! - A[j]!, db = B[i]! - B[j]!, dc = C[i]! - C[j]!;
      if (db !== 0) { best = lpTry(-h, -(dc - da * h) / db, best, m, lim); best = lpTry(h, -(dc + da * h) / db, best, m, lim); }
      if (da !== 0) { best = lpTry(-(dc - db * h) / da, -h, best, m, lim); best = lpTry(-(dc + db * h) / da, h, best, m, lim); }
      for (let k = j + 1; k < m; k++) {
        const ea = A[i]! - A[k]!, eb = B[i]! - B[k]!, ec = C[i]! - C[k]!;
        const det = da * eb - db * ea;
        if (det !== 0) best = lpTry((-dc * eb + db * ec) / det, (-da * ec + dc * ea) / det, best, m, lim);
      }
    }
  }
  return best;
}

/** maxOfMinLinear's candidate (u, v): min_k g_k there when inside the box and above `best`, else `best`. */
function lpTry(u: number, v: number, best: number, m: number, lim: number): number {
  if (!(Math.abs(u) <= lim && Math.abs(v) <= lim)) return best;
  const A = lpA, B = lpB, C = lpC;
  let low = Infinity;
  for (let i = 0; i < m; i++) { const g = A[i]! * u + B[i]! * v + C[i]!; if (g < low) { low = g; if (low <= best) return best; } }
  return low;
}

/** How many of the nearest pieces, and of the farthest, feed the linear-programme bound of a cell. */
const BOUND_NEAR = 3, BOUND_FAR = 2;
/** Below this many pieces a scan is cheaper than the index (for the inside test). */
const SCAN_PIECES = 48;
/** Most pieces in a leaf of the chord tree. */
const CHORD_LEAF = 4;

/**
 * A strip tree over the outline's pieces in drawing order [D. H. Ballard, "Strip trees: a hierarchical
 * representation for curves", CACM 24(5), 1981]: node k is a run of consecutive pieces, the chord from
 * the run's first point to its last, and ε, the largest distance of a point of the run from that
 * chord (a line piece's is its farther end's, as the distance to a segment is convex along a line; an
 * arc's adds its sagitta, the most it strays from its own chord). Every point of the run lies within ε
 * of the chord, so the run is no nearer to a point than the chord less ε and no farther than the
 * chord's farthest point plus ε. Children of k are 2k + 1 and 2k + 2; a run of at most CHORD_LEAF
 * pieces is a leaf.
 */
export function buildChordTree(pieces: readonly SearchPiece[]) {
  const n = pieces.length;
  // Halving reaches runs of at most CHORD_LEAF pieces at the depth where 2^depth · CHORD_LEAF ≥ n.
  let leaves = 1;
  while (CHORD_LEAF * leaves < n) leaves *= 2;
  const size = 2 * leaves;
  const lo = new Int32Array(size).fill(-1), hi = new Int32Array(size);
  const ax = new Float64Array(size), ay = new Float64Array(size), bx = new Float64Array(size), by = new Float64Array(size), eps = new Float64Array(size);
  const sagitta = pieces.map((p) => {
    const c = p.circle;
    if (!c) return 0;
    const half = len(p.bx - p.ax, p.by - p.ay) / 2;
    return c.r - Math.sqrt(Math.max(0, c.r * c.r - half * half));
  });
  const build = (k: number, from: number, to: number) => {
    lo[k] = from; hi[k] = to;
    const x0 = pieces[from]!.ax, y0 = pieces[from]!.ay, x1 = pieces[to - 1]!.bx, y1 = pieces[to - 1]!.by;
    ax[k] = x0; ay[k] = y0; bx[k] = x1; by[k] = y1;
    let e = 0;
    for (let i = from; i < to; i++) {
      const p = pieces[i]!;
      e = Math.max(e, Math.max(distToSegment(p.ax, p.ay, x0, y0, x1, y1), distToSegment(p.bx, p.by, x0, y0, x1, y1)) + sagitta[i]!);
    }
    eps[k] = e;
    if (to - from <= CHORD_LEAF) return;
    const mid = (from + to) >> 1;
    build(2 * k + 1, from, mid);
    build(2 * k + 2, mid, to);
  };
  if (n > 0) build(0, 0, n);
  return { lo, hi, ax, ay, bx, by, eps };
}

/**
 * Distance queries on an outline, with the same values as scanning every piece: the nearest and the
 * farthest pieces are found by depth-first descents of a chord tree (`buildChordTree`), the more
 * promising child first, which skip a run when its bound cannot beat the pieces already held; inside
 * (even-odd) by a flatbush query of the pieces crossing the ray to the right of the point. On a near-circle every piece is almost equally
 * far from the cells near its centre, where boxes of pieces (axis-aligned, as wide as a diagonal piece
 * is long) separate little and the chords' strips separate well.
 */
export function createOutlineDistance(outline: SearchOutline) {
  const pieces = outline.pieces, n = pieces.length;
  // The pieces' boxes: their extent, and for the inside test an index of them when scanning them all would cost more.
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  // The latest index is kept for its layout (keepShape.ts); it holds at most MAX_ROUNDNESS_PIECES boxes.
  const index = n > SCAN_PIECES ? keepShape(new Flatbush(n)) : null;
  for (const p of pieces) {
    const box = pieceBox(p);
    index?.add(...box);
    minX = Math.min(minX, box[0]); minY = Math.min(minY, box[1]); maxX = Math.max(maxX, box[2]); maxY = Math.max(maxY, box[3]);
  }
  index?.finish();
  const all = pieces.map((_, i) => i);
  const tree = buildChordTree(pieces);
  const { lo, hi, ax, ay, bx, by, eps } = tree;
  const slack = n === 0 ? 0 : 1e-12 * (Math.abs(minX) + Math.abs(minY) + Math.abs(maxX) + Math.abs(maxY));
  // The descent's stack of nodes and their bounds: a pending sibling a level at most, so ~log₂ n entries.
  const stack = new Int32Array(128), stackBound = new Float64Array(128);
  /** The nearest pieces (nearCount of them, nearest first) and their distances. */
  const near = new Int32Array(BOUND_NEAR), nearD = new Float64Array(BOUND_NEAR);
  let nearCount = 0;
  /** The nearest distance; `near` holds the `keep` (≤ BOUND_NEAR) nearest pieces, nearest first. */
  const nearest = (x: number, y: number, keep: number) => {
    nearCount = 0;
    if (n === 0) return Infinity;
    let top = 0;
    stack[top] = 0; stackBound[top++] = -Infinity;
    while (top > 0) {
      const k = stack[--top]!;
      if (nearCount === keep && stackBound[top]! >= nearD[keep - 1]!) continue;
      if (hi[k]! - lo[k]! <= CHORD_LEAF) {
        for (let i = lo[k]!; i < hi[k]!; i++) {
          const d = distToPiece(pieces[i]!, x, y);
          if (nearCount === keep && d >= nearD[keep - 1]!) continue;
          let m = Math.min(nearCount, keep - 1);
          if (nearCount < keep) nearCount++;
          near[m] = i; nearD[m] = d;
          while (m > 0 && nearD[m - 1]! > d) { near[m] = near[m - 1]!; nearD[m] = nearD[m - 1]!; near[m - 1] = i; nearD[m - 1] = d; m--; }
        }
        continue;
      }
      // The nearer child is pushed last, so it is searched first.
      const l = 2 * k + 1, r = l + 1;
      const bl = distToSegment(x, y, ax[l]!, ay[l]!, bx[l]!, by[l]!) - eps[l]! - slack;
      const br = distToSegment(x, y, ax[r]!, ay[r]!, bx[r]!, by[r]!) - eps[r]! - slack;
      const first = bl <= br ? r : l, second = bl <= br ? l : r;
      stack[top] = first; stackBound[top++] = Math.max(bl, br);
      stack[top] = second; stackBound[top++] = Math.min(bl, br);
    }
    return nearD[0]!;
  };
  const inside = (x: number, y: number) => {
    let odd = false;
    for (const i of index ? index.search(x, y, maxX, y) : all) {
      const cx = crossingX(pieces[i]!, y);
      if (cx !== null && x < cx) odd = !odd;
    }
    return odd;
  };
  /** The BOUND_FAR farthest pieces (farCount of them, farthest first), their distances and their
   *  farthest points [distance, x, y]. */
  const farPiece = new Int32Array(BOUND_FAR), farD = new Float64Array(BOUND_FAR);
  const far: [number, number, number][] = [];
  let farCount = 0;
  /** The farthest distance; `far` holds the farthest pieces' farthest points, farthest first. */
  const farthest = (x: number, y: number) => {
    farCount = 0;
    if (n === 0) return 0;
    let top = 0;
    stack[top] = 0; stackBound[top++] = Infinity;
    while (top > 0) {
      const k = stack[--top]!;
      if (farCount === BOUND_FAR && stackBound[top]! <= farD[BOUND_FAR - 1]!) continue;
      if (hi[k]! - lo[k]! <= CHORD_LEAF) {
        for (let i = lo[k]!; i < hi[k]!; i++) {
          const d = farthestDistance(pieces[i]!, x, y);
          if (farCount === BOUND_FAR && d <= farD[BOUND_FAR - 1]!) continue;
          let m = Math.min(farCount, BOUND_FAR - 1);
          if (farCount < BOUND_FAR) farCount++;
          farD[m] = d; farPiece[m] = i;
          while (m > 0 && farD[m - 1]! < d) { farD[m] = farD[m - 1]!; farPiece[m] = farPiece[m - 1]!; farD[m - 1] = d; farPiece[m - 1] = i; m--; }
        }
        continue;
      }
      // The farther child is pushed last, so it is searched first.
      const l = 2 * k + 1, r = l + 1;
      const bl = Math.max(len(x - ax[l]!, y - ay[l]!), len(x - bx[l]!, y - by[l]!)) + eps[l]! + slack;
      const br = Math.max(len(x - ax[r]!, y - ay[r]!), len(x - bx[r]!, y - by[r]!)) + eps[r]! + slack;
      const first = bl >= br ? r : l, second = bl >= br ? l : r;
      stack[top] = first; stackBound[top++] = Math.min(bl, br);
      stack[top] = second; stackBound[top++] = Math.max(bl, br);
    }
    for (let k = 0; k < farCount; k++) far[k] = farthestOnPiece(pieces[farPiece[k]!]!, x, y);
    return farD[0]!;
  };
  /** The nearest pieces' linear bounds over the cell (nearBounds gives how many). */
  const gs: Bound[] = [];
  const nearBounds = (x: number, y: number, h: number) => {
    let count = 0;
    for (let k = 0; k < nearCount; k++) { const g = linearUpperBound(pieces[near[k]!]!, x, y, h); if (g) gs[count++] = g; }
    return count;
  };
  /** Rows of the linear programme of a cell (3 numbers each), grown as needed. */
  let rows = new Float64Array(3 * 16);
  const setRow = (k: number, a: number, b: number, c: number) => {
    if (3 * k + 3 > rows.length) { const grown = new Float64Array(2 * rows.length); grown.set(rows); rows = grown; }
    rows[3 * k] = a; rows[3 * k + 1] = b; rows[3 * k + 2] = c;
  };
  return {
    /** The pieces' bounding box [minX, minY, maxX, maxY] (infinite when there are none). */
    box: [minX, minY, maxX, maxY] as const,
    /** Signed distance (positive inside) at the cell's centre, an upper bound over the cell, and
     *  the cell's side of the outline for its children (1 inside, 0 outside, −1 when it may meet
     *  the outline). */
    signedWithBound: (x: number, y: number, h: number, parentSide: number | null, cutoff: number): Evaluation<number> => {
      const d = nearest(x, y, BOUND_NEAR);
      const side = parentSide !== null && parentSide >= 0 ? parentSide : inside(x, y) ? 1 : 0;
      const f = side === 1 ? d : -d;
      const next = d > h * Math.SQRT2 + slack ? side : -1;
      let upper = f + h * Math.SQRT2;
      if (upper <= cutoff) return { f, upper, next, exact: false };
      const count = nearBounds(x, y, h);
      for (let k = 0; k < count; k++) setRow(k, gs[k]![0], gs[k]![1], gs[k]![2]);
      if (count > 0) upper = Math.min(upper, maxOfMinLinear(rows, count, x, y, h) + slack);
      return { f, upper, next, exact: true };
    },
    /**
     * Minus the zone width (farthest − nearest) at the cell's centre and an upper bound over the
     * cell: the Lipschitz bound (constant 2), or min over pairs of g_near − ℓ_far, where
     * ℓ(p) = u·(p − Q) ≤ |p − Q| ≤ farthest(p) for a farthest point Q and u the unit vector from Q to
     * the centre. Nothing is handed to the children.
     */
    negWidthWithBound: (x: number, y: number, h: number, _parent: null, cutoff: number): Evaluation<null> => {
      const f = nearest(x, y, BOUND_NEAR) - farthest(x, y);
      let upper = f + 2 * h * Math.SQRT2;
      if (upper <= cutoff) return { f, upper, next: null, exact: false };
      const count = nearBounds(x, y, h);
      let pairs = 0;
      for (let k = 0; k < farCount; k++) {
        const farthestPoint = far[k]!;
        let D = farthestPoint[0], qx = farthestPoint[1], qy = farthestPoint[2];
        if (D === 0) continue;
        // farthest(p) ≥ |p − Q| + r for Q = C of a circle piece whose farthest direction from every
        // point of the cell lies in its span, else ≥ |p − Q| (r = 0) for the farthest point Q found.
        const outer = pieces[farPiece[k]!]!, oc = outer.circle;
        let r = 0;
        if (oc && len(Math.max(0, Math.abs(x - oc.cx) - h), Math.max(0, Math.abs(y - oc.cy) - h)) > 0) {
          let spans = true;
          for (let t = 0; t < 4 && spans; t++) spans = inSpan(outer, oc.cx - x - (t & 1 ? h : -h), oc.cy - y - (t & 2 ? h : -h));
          if (spans) { qx = oc.cx; qy = oc.cy; r = oc.r; D = len(x - qx, y - qy); }
        }
        // −farthest ≤ −|p − Q| − r ≤ −u·(p − Q) − r − β(e·u⊥)².
        const ux = (x - qx) / D, uy = (y - qy) / D, beta = concavity(D, ux, uy, h), k0 = -(ux * qx + uy * qy) + r;
        for (let j = 0; j < count; j++) {
          const g = gs[j]!, a = g[0], b = g[1], c = g[2], gb = g[3], px = g[4], py = g[5];
          setRow(pairs++, a - ux, b - uy, c - k0);
          const qp = maxConcaveQuadratic((a - ux) * x + (b - uy) * y + c - k0, a - ux, b - uy,
            gb * px * px + beta * uy * uy, gb * px * py - beta * ux * uy, gb * py * py + beta * ux * ux, h);
          upper = Math.min(upper, qp + slack);
        }
        for (let j = 0; j < nearCount; j++) {
          const g = circleGapUpperBound(pieces[near[j]!]!, outer, x, y, h);
          if (g) setRow(pairs++, g[0], g[1], g[2]);
        }
      }
      if (pairs > 0) upper = Math.min(upper, maxOfMinLinear(rows, pairs, x, y, h) + slack);
      return { f, upper, next: null, exact: true };
    },
    /** Zone width and outer radius about a point. */
    width: (x: number, y: number) => { const outer = farthest(x, y); return { width: outer - nearest(x, y, 1), outer }; },
  };
}

// ---------------------------------------------------------------- branch and bound

interface Cell<S> { x: number; y: number; h: number; f: number; bound: number; next: S; parent: S | null; exact: boolean }

/** What `evaluate` gives for a cell: f at its centre, an upper bound of f over it, what it hands its
 *  children, and whether the bound is the full one (false: only the cheap Lipschitz bound, given
 *  because it was already at or below the cutoff asked for). */
interface Evaluation<S> { f: number; upper: number; next: S; exact: boolean }

/**
 * Best-first branch and bound maximising f over square cells; `evaluate` gives f at a cell's centre,
 * an upper bound of f over the cell and what the cell hands its children (`parent` of their
 * evaluations; null for the first cell). A cell whose cheap bound already lies within `tol` of the
 * best value so far when it is made gets only that bound: it can never be split, and its full bound
 * is worked out only if it comes to the top of the heap (then it goes back with it), so the cells
 * split and the answer are those of full bounds everywhere, at a fraction of the work (about two
 * thirds of a small polygon's cells are such). Returns the best point, its value and the largest
 * upper bound left when stopping (≤ best + tol unless capped).
 */
function maximise<S>(evaluate: (x: number, y: number, h: number, parent: S | null, cutoff: number) => Evaluation<S>, box: readonly [number, number, number, number], tol: number, accept: (x: number, y: number, h: number) => boolean) {
  const [minX, minY, maxX, maxY] = box;
  const size = Math.max(maxX - minX, maxY - minY) || 1;
  const heap: Cell<S>[] = [];
  let best = { x: (minX + maxX) / 2, y: (minY + maxY) / 2, f: -Infinity };
  const insert = (cell: Cell<S>) => {
    heap.push(cell);
    let i = heap.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (heap[p]!.bound >= heap[i]!.bound) break;
      [heap[p], heap[i]] = [heap[i]!, heap[p]!];
      i = p;
    }
  };
  const push = (x: number, y: number, h: number, parent: S | null) => {
    if (!accept(x, y, h)) return;
    const { f, upper, next, exact } = evaluate(x, y, h, parent, best.f + tol);
    if (f > best.f) best = { x, y, f };
    insert({ x, y, h, f, bound: upper, next, parent, exact });
  };
  const pop = (): Cell<S> => {
    const top = heap[0]!;
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1, r = l + 1;
        let m = i;
        if (l < heap.length && heap[l]!.bound > heap[m]!.bound) m = l;
        if (r < heap.length && heap[r]!.bound > heap[m]!.bound) m = r;
        if (m === i) break;
        [heap[m], heap[i]] = [heap[i]!, heap[m]!];
        i = m;
      }
    }
    return top;
  };
  const h0 = size / 2;
  push((minX + maxX) / 2, (minY + maxY) / 2, h0, null);
  let cells = 0;
  let capped = false;
  while (heap.length > 0) {
    const c = pop();
    if (!c.exact) {
      insert({ ...c, bound: evaluate(c.x, c.y, c.h, c.parent, -Infinity).upper, exact: true });
      continue;
    }
    if (c.bound - best.f <= tol) {
      heap.length = 0;
      return { ...best, upper: Math.max(best.f, c.bound), capped };
    }
    if (++cells > MAX_ROUNDNESS_CELLS) {
      capped = true;
      return { ...best, upper: c.bound, capped };
    }
    const h = c.h / 2;
    push(c.x - h, c.y - h, h, c.next); push(c.x + h, c.y - h, h, c.next); push(c.x - h, c.y + h, h, c.next); push(c.x + h, c.y + h, h, c.next);
  }
  return { ...best, upper: best.f, capped };
}

/**
 * Minimum-zone roundness of an outline, searched inside the smallest enclosing disc of its hull
 * points. F(c) = farthest − nearest is 2-Lipschitz, so the branch and bound is exact up to
 * `errorBound` (its gap); the outline's own deviation δ is the caller's to add.
 */
function minimumZoneOf(outline: SearchOutline, mec: Circle, tolerance?: number, distance = createOutlineDistance(outline)) {
  const tol = tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * 2 * mec.r;
  const { negWidthWithBound, width } = distance;
  const r = maximise(
    negWidthWithBound,
    [mec.x - mec.r, mec.y - mec.r, mec.x + mec.r, mec.y + mec.r], tol,
    (x, y, h) => len(x - mec.x, y - mec.y) <= mec.r + h * Math.SQRT2,
  );
  // Clamp the best centre into the disc (cells may overhang it) and re-evaluate.
  let { x, y } = r;
  const dc = len(x - mec.x, y - mec.y);
  if (dc > mec.r) { x = mec.x + ((x - mec.x) * mec.r) / dc; y = mec.y + ((y - mec.y) * mec.r) / dc; }
  const { width: value, outer } = width(x, y);
  return {
    widthMm: value, centreX: x, centreY: y, outerRadiusMm: outer, innerRadiusMm: outer - value,
    errorBoundMm: Math.max(0, value + r.upper), capped: r.capped,
    onSearchRim: len(x - mec.x, y - mec.y) >= mec.r * (1 - 1e-6),
  };
}

/**
 * Minimum-zone roundness of a closed polyline (inner distances to its edges) or of a point set
 * (`asPoints`: inner distances to the points, as for measured profiles), searched inside the
 * smallest enclosing disc. Exact up to `errorBound` (the branch-and-bound gap).
 */
export function getMinimumZone(points: readonly Pt[], options: { asPoints?: boolean; tolerance?: number } = {}) {
  return minimumZoneOf(outlineFromPoints(points, options.asPoints), getSmallestEnclosingCircle(points), options.tolerance);
}

/**
 * Largest inscribed circle of an outline (even-odd inside), to `tolerance`: branch and bound on the
 * signed distance with the linear-programme cell bound, which is exact on plateaus (a rectangle's
 * inradius is reached along a segment) where the Lipschitz bound alone never closes the gap.
 */
function inscribedCircleOf(outline: SearchOutline, tolerance?: number, distance = createOutlineDistance(outline)) {
  const { signedWithBound, box } = distance;
  const tol = tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * len(box[2] - box[0], box[3] - box[1]);
  const r = maximise(signedWithBound, box, tol, () => true);
  return { radiusMm: r.f, centreX: r.x, centreY: r.y, errorBoundMm: Math.max(0, r.upper - r.f), capped: r.capped };
}

/** Largest inscribed circle of a closed polyline (even-odd inside), to `tolerance`. */
export function getLargestInscribedCircle(points: readonly Pt[], tolerance?: number) {
  return inscribedCircleOf(outlineFromPoints(points), tolerance);
}

/**
 * ∬ w(p)² dA of a closed polyline, exact by horizontal slabs (see the module comment). The edges
 * crossing a slab's mid-height are found by a sweep upwards over the edges sorted by their lower
 * end, dropping those it has passed, so each slab visits only the edges it meets. Equal crossing
 * x's add w²·0 whatever their order, so the sum is the same as over all edges in drawing order.
 */
export function getWindingSquaredArea(points: readonly Pt[], extraHeights: readonly number[] = []): number {
  const ys = [...new Set([...points.map((p) => p[1]), ...extraHeights])].sort((a, b) => a - b);
  const n = points.length;
  // Edge i runs from the previous point to point i.
  const from = (i: number) => points[i === 0 ? n - 1 : i - 1]!;
  const low = (i: number) => Math.min(from(i)[1], points[i]![1]);
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => low(i) - low(j));
  let next = 0;
  let active: number[] = [];
  let total = 0;
  for (let k = 0; k + 1 < ys.length; k++) {
    const y0 = ys[k]!, y1 = ys[k + 1]!;
    const y = (y0 + y1) / 2;
    while (next < n && low(order[next]!) <= y) active.push(order[next++]!);
    active = active.filter((i) => Math.max(from(i)[1], points[i]![1]) > y);
    const xs: [number, number][] = [];
    for (const i of active) {
      const a = from(i), b = points[i]!;
      if ((a[1] > y) === (b[1] > y)) continue;
      const x = a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
      xs.push([x, b[1] > a[1] ? 1 : -1]);
    }
    xs.sort((p, q) => p[0] - q[0]);
    // Winding at a point = Σ over crossings to its right of (+1 upward, −1 downward) (y-up, CCW > 0).
    let w = xs.reduce((s, c) => s + c[1], 0);
    let line = 0;
    for (let i = 0; i + 1 < xs.length; i++) {
      w -= xs[i]![1];
      line += w * w * (xs[i + 1]![0] - xs[i]![0]);
    }
    total += line * (y1 - y0);
  }
  return total;
}

const toCircle = (valueMm: number, centreXMm: number, centreYMm: number, errorBoundMm: number): MeasuredCircle =>
  ({ value: { valueMm, centreXMm, centreYMm, errorBoundMm } });

const undef = (reason: string) => ({ value: null, reason }) as const;

/** The reasons every open (or extent-less) contour shares: one object each, not one per contour (a
 *  drawing of loose entities has hundreds of thousands of open contours). Results are read only. */
const NOT_CLOSED = Object.freeze(undef('the contour is not closed'));
const NO_EXTENT = Object.freeze(undef('the contour has no extent'));
const SIMPLE_WINDING = Object.freeze(undef('defined for self-crossing contours only; for a simple contour it equals the area'));

/** The last roundness figures of an open contour: the next one with the same reason and Bonnesen
 *  figure (usually the measures' one shared "open contour" object) shares them. */
let lastOpen: ContourRoundness | null = null;

/** The hull figures of a contour with these metrics, from its flattened hull's measures. */
function toContourHull(h: HullMeasures, metrics: ContourMetrics, selfCrossing: boolean): ContourHull {
  const convexity: Measured = metrics.areaMm2.value === null ? metrics.areaMm2
    : selfCrossing ? { value: null, reason: 'the contour crosses itself, so its net area is not the material area' }
    // The flattened hull lies inside the true one (area short by ≤ areaErrorMm2), so the ratio may
    // exceed 1 by that much; the true ratio never does (the hull contains the contour).
    : h.areaMm2 > 0 ? { value: Math.min(1, metrics.areaMm2.value / h.areaMm2) } : { value: null, reason: 'the convex hull has no area' };
  return { areaMm2: h.areaMm2, perimeterMm: h.perimeterMm, areaErrorMm2: h.areaErrorMm2, perimeterErrorMm: h.perimeterErrorMm, convexity };
}

/**
 * All roundness figures of one contour. `selfCrossing` comes from the file's intersections
 * (intersect.ts), computed once per analysis.
 */
export function getRoundness(contour: Contour, metrics: ContourMetrics, selfCrossing: boolean): ContourShape {
  const [a, b, c, d] = metrics.bboxMm;
  const size = len(c - a, d - b);
  const flatteningMm = ROUNDNESS_FLATTENING_RELATIVE * size;
  const deficit = metrics.deficitMm2;
  const bonnesen: Measured = selfCrossing
    ? { value: null, reason: 'the contour crosses itself, so the deficit from its net area is meaningless' }
    : deficit.value === null ? deficit : { value: Math.sqrt(Math.max(0, deficit.value)) / Math.PI };
  // A contour that turns one way is its own hull, in closed form (convexContour.ts).
  const convex = selfCrossing ? null : getConvexContourHull(contour, metrics);
  if (!metrics.closed || size === 0) {
    // Only the hull's measures: no polyline or hull vertices are kept.
    const hull = toContourHull(convex ?? getContourHullMeasures(contour, flatteningMm), metrics, selfCrossing);
    const why = metrics.closed ? NO_EXTENT : NOT_CLOSED;
    if (lastOpen?.inradius !== why || lastOpen.bonnesenBoundMm !== bonnesen || lastOpen.selfCrossing !== selfCrossing) {
      lastOpen = Object.freeze({ inradius: why, circumradius: why, minZone: why, bonnesenBoundMm: bonnesen, radiusGapMm: why, selfCrossing, windingSquaredAreaMm2: why });
    }
    return { hull, roundness: lastOpen };
  }
  const circle = convex && getContourCircle(contour, size);
  if (circle) {
    // A whole circle (circleContour.ts): ρ = R = r and a zone of 0, each within its spread d.
    const { cx, cy, r, deviationMm: d } = circle;
    return {
      hull: toContourHull(convex, metrics, false),
      roundness: {
        inradius: toCircle(r, cx, cy, d), circumradius: toCircle(r, cx, cy, d), minZone: toCircle(0, cx, cy, 2 * d),
        bonnesenBoundMm: bonnesen, radiusGapMm: { value: 0 }, selfCrossing: false, windingSquaredAreaMm2: SIMPLE_WINDING,
      },
    };
  }
  const poly = getTransientPolyline(contour, flatteningMm);
  const hullFigures = getPolylineHull(poly);
  const hull = toContourHull(convex ?? hullFigures, metrics, selfCrossing);
  const delta = poly.deviationMm;
  const mec = getSmallestEnclosingCircle(hullFigures.points);
  const circumradius = toCircle(mec.r, mec.x, mec.y, delta);
  let windingSquared: Measured = SIMPLE_WINDING;
  if (selfCrossing) {
    if (poly.xs.length > MAX_WINDING_INTEGRAL_VERTICES) windingSquared = undef(`the flattened contour has more than ${MAX_WINDING_INTEGRAL_VERTICES} vertices`);
    else {
      const points = Array.from(poly.xs, (x, i): Pt => [x, poly.ys[i]!]);
      const crossings = findSelfIntersections(polylineContour(contour, points));
      windingSquared = crossings.stopped
        ? undef('the flattened contour meets itself in more places than the intersection search examines')
        : { value: getWindingSquaredArea(points, crossings.intersections.map((x) => x.y)) };
    }
  }
  const searchPieces = countSearchPieces(poly);
  let reduced: ReducedVertices | undefined;
  if (searchPieces > MAX_ROUNDNESS_PIECES) {
    const r = reduceVertices(poly, MAX_ROUNDNESS_PIECES);
    if (!r) {
      const why = undef(`the flattened contour has ${searchPieces} pieces, and reducing them to the ${MAX_ROUNDNESS_PIECES} searched needs more work than is allowed`);
      return { hull, roundness: { inradius: why, circumradius, minZone: why, bonnesenBoundMm: bonnesen, radiusGapMm: why, selfCrossing, windingSquaredAreaMm2: windingSquared } };
    }
    reduced = r;
  }
  const outline = outlineFromPolyline(poly, contour, flatteningMm, reduced);
  const searchDelta = outline.deviationMm;
  // A reduced outline is known to ±δ only: searching to a finer gap than δ would not tighten the bound.
  const tolerance = reduced ? Math.max(ROUNDNESS_RELATIVE_TOLERANCE * size, searchDelta) : undefined;
  const distance = createOutlineDistance(outline);
  const lic = inscribedCircleOf(outline, tolerance, distance);
  const inradius = toCircle(lic.radiusMm, lic.centreX, lic.centreY, lic.errorBoundMm + searchDelta);
  let minZone: MeasuredCircle = undef('the contour crosses itself, so it has no inside to zone');
  if (!selfCrossing) {
    const mz = minimumZoneOf(outline, mec, tolerance, distance);
    minZone = mz.onSearchRim
      ? undef('not round: the shape is elongated, so the best centre lies on the rim of its enclosing circle and no finite minimum zone exists')
      : toCircle(mz.widthMm, mz.centreX, mz.centreY, mz.errorBoundMm + 2 * searchDelta);
  }
  return {
    hull,
    roundness: {
      inradius, circumradius, minZone, bonnesenBoundMm: bonnesen,
      radiusGapMm: { value: mec.r - lic.radiusMm },
      selfCrossing, windingSquaredAreaMm2: windingSquared,
    },
  };
}

function polylineContour(c: Contour, pts: readonly Pt[]): Contour {
  const span = c.span;
  return {
    ...c,
    closed: true,
    startX: pts[0]![0], startY: pts[0]![1],
    segments: pts.map((p, i) => {
      const q = pts[(i + 1) % pts.length]!;
      return { kind: 'line' as const, x0: p[0], y0: p[1], x1: q[0], y1: q[1], span };
    }),
  };
}
