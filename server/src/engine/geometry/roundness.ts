/**
 * Roundness of a closed contour (REFERENCES.md §1.2–1.4, §3):
 * - circumradius R: smallest enclosing circle of the hull vertices, Welzl's algorithm (§3.3);
 * - inradius ρ: largest circle inside the contour, by best-first branch and bound over square cells
 *   of the signed distance to the outline (1-Lipschitz, so a cell of half-diagonal h around a centre
 *   with distance d holds nothing above d + h) [common practice, no source; the same bound drives the
 *   "pole of inaccessibility" search];
 * - minimum-zone roundness t_MZ (ISO 12181, §3.1): the least radial separation of two concentric
 *   circles enclosing the outline. F(c) = max|c − p| − min dist(c, outline) is 2-Lipschitz in c, so
 *   branch and bound over cells gives the global minimum over the search region to a tolerance.
 *   The region is the smallest enclosing disc, as §3.4 asks ("elongated shapes have no finite MZ
 *   centre"); the result says when the best centre lies on the region's rim.
 * - Bonnesen: R − ρ ≤ √D/π (§1.2–1.3); Banchoff–Pohl: L² ≥ 4π∬w² dA (§1.4), with ∬w² dA computed
 *   exactly on the polyline by horizontal slabs (between consecutive vertex/crossing heights every
 *   crossing x is linear in y, so the slab's ∫w² dx is linear and its midpoint value is exact).
 * Curved outlines are flattened within δ (hull.ts); max and min distances then move by ≤ δ, so R and
 * ρ carry ±δ and t_MZ ±2δ on top of the search tolerance; both are in the stated error bound.
 */
import Flatbush from 'flatbush';
import type { Contour, ContourHull, ContourMetrics, ContourRoundness, Measured, MeasuredCircle } from '../types';
import { findSelfIntersections } from './intersect';
import { getContourPolyline, getPolylineHull, type Polyline } from './hull';

/** Search tolerance of the branch and bound, relative to the outline's size (bbox diagonal). */
export const ROUNDNESS_RELATIVE_TOLERANCE = 1e-8;
/** Flattening tolerance for curves, relative to the outline's size (bbox diagonal): 1 µm on a 100 mm
 *  part, far below a kerf, and part of every stated error bound. 1e-6 gave a 10 mm slot ~1130 vertices
 *  instead of ~360 and made the sample files' roundness ~2× slower. [common practice, no source] */
export const ROUNDNESS_FLATTENING_RELATIVE = 1e-5;
/** Most cells evaluated by one branch-and-bound search; the bound reached is reported if hit. */
export const MAX_ROUNDNESS_CELLS = 2000;
/** Most polyline vertices for the slab integral ∬w² dA (its cost is quadratic). */
export const MAX_WINDING_INTEGRAL_VERTICES = 20000;
/** Most search pieces (lines, chords of flattened curves, arcs of circles) for the inradius and
 *  minimum-zone searches. Each of their ≤ MAX_ROUNDNESS_CELLS cells queries the piece index, but near
 *  a medial axis many pieces are almost equally far, so a cell still visits a share of them growing
 *  with the piece count. Above it those figures are undefined with this reason; the circumradius and
 *  hull are still given. */
export const MAX_ROUNDNESS_PIECES = 2000;

type Pt = readonly [number, number];

export interface Circle { readonly x: number; readonly y: number; readonly r: number }

// ---------------------------------------------------------------- smallest enclosing circle

function circleFrom2(a: Pt, b: Pt): Circle {
  const x = (a[0] + b[0]) / 2, y = (a[1] + b[1]) / 2;
  return { x, y, r: Math.hypot(a[0] - x, a[1] - y) };
}

function circleFrom3(a: Pt, b: Pt, c: Pt): Circle | null {
  const bx = b[0] - a[0], by = b[1] - a[1], cx = c[0] - a[0], cy = c[1] - a[1];
  const d = 2 * (bx * cy - by * cx);
  if (d === 0) return null;
  const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
  const ux = (cy * b2 - by * c2) / d, uy = (bx * c2 - cx * b2) / d;
  return { x: a[0] + ux, y: a[1] + uy, r: Math.hypot(ux, uy) };
}

const inCircle = (c: Circle, p: Pt) => Math.hypot(p[0] - c.x, p[1] - c.y) <= c.r * (1 + 1e-14) + 1e-300;

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
interface SearchPiece {
  readonly ax: number; readonly ay: number; readonly bx: number; readonly by: number;
  readonly circle: { readonly cx: number; readonly cy: number; readonly r: number; readonly ccw: boolean } | null;
}

/** The outline as search pieces, and the largest distance between it and the contour (δ). */
export interface SearchOutline {
  readonly pieces: readonly SearchPiece[];
  readonly deviationMm: number;
}

/** A closed polyline (or, with `asPoints`, a point set) as search pieces. */
export function outlineFromPoints(points: readonly Pt[], asPoints = false): SearchOutline {
  const n = points.length;
  return {
    pieces: points.map((a, i) => {
      const b = asPoints ? a : points[(i + 1) % n]!;
      return { ax: a[0], ay: a[1], bx: b[0], by: b[1], circle: null };
    }),
    deviationMm: 0,
  };
}

/**
 * A flattened contour as search pieces: arcs of circles stay exact arcs (their chords are dropped),
 * everything else is its chords. δ is the largest deviation of a flattened piece or of an arc from
 * its circle, so distances to the outline are within ±δ of distances to the contour.
 */
export function outlineFromPolyline(poly: Polyline): SearchOutline {
  const pts = poly.points, n = pts.length;
  const pieces: SearchPiece[] = [];
  let deviation = 0;
  poly.pieces.forEach((p, k) => {
    const end = k + 1 < poly.pieces.length ? poly.pieces[k + 1]!.first : n;
    const [ax, ay] = pts[p.first]!, [bx, by] = pts[end % n]!;
    const c = p.circle;
    if (c) {
      deviation = Math.max(deviation, c.deviationMm);
      const ccw = (ax - c.cx) * (by - c.cy) - (ay - c.cy) * (bx - c.cx) > 0;
      pieces.push({ ax, ay, bx, by, circle: { cx: c.cx, cy: c.cy, r: c.r, ccw } });
      return;
    }
    deviation = Math.max(deviation, p.deviationMm);
    for (let i = p.first; i < end; i++) {
      const [x0, y0] = pts[i]!, [x1, y1] = pts[(i + 1) % n]!;
      pieces.push({ ax: x0, ay: y0, bx: x1, by: y1, circle: null });
    }
  });
  return { pieces, deviationMm: deviation };
}

/** Whether the direction (dx, dy) from a circle piece's centre lies in its sector. */
function inSector(p: SearchPiece, dx: number, dy: number): boolean {
  const c = p.circle!;
  const [sx, sy, ex, ey] = c.ccw ? [p.ax - c.cx, p.ay - c.cy, p.bx - c.cx, p.by - c.cy] : [p.bx - c.cx, p.by - c.cy, p.ax - c.cx, p.ay - c.cy];
  return sx * dy - sy * dx >= 0 && dx * ey - dy * ex >= 0;
}

function pieceBox(p: SearchPiece): [number, number, number, number] {
  let minX = Math.min(p.ax, p.bx), minY = Math.min(p.ay, p.by), maxX = Math.max(p.ax, p.bx), maxY = Math.max(p.ay, p.by);
  const c = p.circle;
  if (c) {
    // The arc's own ends and any axis-extreme point of the circle inside the sector.
    const ends: [number, number][] = [];
    for (const [dx, dy] of [[p.ax - c.cx, p.ay - c.cy], [p.bx - c.cx, p.by - c.cy]] as const) {
      const l = Math.hypot(dx, dy);
      if (l > 0) ends.push([c.cx + (c.r * dx) / l, c.cy + (c.r * dy) / l]);
    }
    for (const [dx, dy] of [[1, 0], [0, 1], [-1, 0], [0, -1]] as const) if (inSector(p, dx, dy)) ends.push([c.cx + c.r * dx, c.cy + c.r * dy]);
    for (const [x, y] of ends) { minX = Math.min(minX, x); minY = Math.min(minY, y); maxX = Math.max(maxX, x); maxY = Math.max(maxY, y); }
  }
  return [minX, minY, maxX, maxY];
}

function distToSegment(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 === 0 ? 0 : ((x - ax) * dx + (y - ay) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(x - ax - t * dx, y - ay - t * dy);
}

function distToPiece(p: SearchPiece, x: number, y: number): number {
  const c = p.circle;
  if (!c) return distToSegment(x, y, p.ax, p.ay, p.bx, p.by);
  const dx = x - c.cx, dy = y - c.cy;
  const ends = Math.min(Math.hypot(x - p.ax, y - p.ay), Math.hypot(x - p.bx, y - p.by));
  return (dx !== 0 || dy !== 0) && inSector(p, dx, dy) ? Math.min(ends, Math.abs(Math.hypot(dx, dy) - c.r)) : ends;
}

function farthestOnPiece(p: SearchPiece, x: number, y: number): number {
  const ends = Math.max(Math.hypot(x - p.ax, y - p.ay), Math.hypot(x - p.bx, y - p.by));
  const c = p.circle;
  if (!c) return ends;
  const dx = c.cx - x, dy = c.cy - y;
  if (dx === 0 && dy === 0) return Math.max(ends, c.r);
  return inSector(p, dx, dy) ? Math.max(ends, Math.hypot(dx, dy) + c.r) : ends;
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
 * A linear function g ≥ the distance to the piece over the square cell (centre x, y, half-side h),
 * when one exists: for a segment, if the whole cell projects inside it on one side, the distance is
 * linear there; for a circle piece, if the whole cell is inside the circle and in the sector, the
 * distance is r − |p − C| there, below its tangent plane at the cell's centre (Cauchy–Schwarz).
 * Corners suffice: the strip, half-plane, disc and sector (≤ a quarter turn) are convex.
 */
function linearUpperBound(p: SearchPiece, x: number, y: number, h: number): [number, number, number] | null {
  const corners = [x - h, y - h, x + h, y - h, x - h, y + h, x + h, y + h];
  const c = p.circle;
  if (!c) {
    const dx = p.bx - p.ax, dy = p.by - p.ay, l = Math.hypot(dx, dy);
    if (l === 0) return null;
    let sign = 0;
    for (let k = 0; k < 8; k += 2) {
      const qx = corners[k]! - p.ax, qy = corners[k + 1]! - p.ay;
      const t = (qx * dx + qy * dy) / (l * l);
      if (t < 0 || t > 1) return null;
      const s = Math.sign(dx * qy - dy * qx);
      if (s !== 0) { if (sign !== 0 && s !== sign) return null; sign = s; }
    }
    const a = ((sign || 1) * -dy) / l, b = ((sign || 1) * dx) / l;
    return [a, b, -(a * p.ax + b * p.ay)];
  }
  for (let k = 0; k < 8; k += 2) {
    const dx = corners[k]! - c.cx, dy = corners[k + 1]! - c.cy;
    if (Math.hypot(dx, dy) > c.r || !inSector(p, dx, dy)) return null;
  }
  const l = Math.hypot(x - c.cx, y - c.cy);
  if (l === 0) return null;
  const ux = (x - c.cx) / l, uy = (y - c.cy) / l;
  return [-ux, -uy, c.r + ux * c.cx + uy * c.cy];
}

/**
 * max over the square (centre x0, y0, half-side h) of min_k g_k, exact: the maximum of this 2D
 * linear programme lies at a vertex, where two of {box sides, g_i = g_j} or three g are tight, and
 * every such point is tried (points just outside the box only raise the answer, which stays an
 * upper bound).
 */
function maxOfMinLinear(gs: readonly (readonly [number, number, number])[], x0: number, y0: number, h: number): number {
  // Coordinates relative to the cell's centre: g(x0 + u, y0 + v) = a u + b v + (a x0 + b y0 + c).
  const rel = gs.map(([a, b, c]) => [a, b, a * x0 + b * y0 + c] as const);
  const lo = -h * (1 + 1e-9), hi = h * (1 + 1e-9);
  let best = -Infinity;
  const tryAt = (u: number, v: number) => {
    if (!(u >= lo && u <= hi && v >= lo && v <= hi)) return;
    let m = Infinity;
    for (const [a, b, c] of rel) m = Math.min(m, a * u + b * v + c);
    best = Math.max(best, m);
  };
  tryAt(-h, -h); tryAt(h, -h); tryAt(-h, h); tryAt(h, h);
  for (let i = 0; i < rel.length; i++) {
    for (let j = i + 1; j < rel.length; j++) {
      const da = rel[i]![0] - rel[j]![0], db = rel[i]![1] - rel[j]![1], dc = rel[i]![2] - rel[j]![2];
      for (const u of [-h, h]) if (db !== 0) tryAt(u, -(da * u + dc) / db);
      for (const v of [-h, h]) if (da !== 0) tryAt(-(db * v + dc) / da, v);
      for (let k = j + 1; k < rel.length; k++) {
        const ea = rel[i]![0] - rel[k]![0], eb = rel[i]![1] - rel[k]![1], ec = rel[i]![2] - rel[k]![2];
        const det = da * eb - db * ea;
        if (det !== 0) tryAt((-dc * eb + db * ec) / det, (-da * ec + dc * ea) / det);
      }
    }
  }
  return best;
}

/** How many of the nearest pieces feed the linear-programme bound of a cell. */
const BOUND_PIECES = 4;

/**
 * Distance queries on an outline from a flatbush index of its pieces, with the same results as
 * scanning every piece:
 * - nearest: the piece nearest by box gives an upper bound d0 on the distance; every piece at
 *   distance ≤ d0 has its box within the square of half-side d0, so the minimum over those is exact;
 * - inside (even-odd): a piece crossing the ray to the right of the point has a box meeting that ray;
 * - `upper(x, y, h)`: an upper bound on the distance over the cell, the smaller of the Lipschitz bound
 *   d + h√2 and the linear programme over the linear bounds of the BOUND_PIECES nearest pieces.
 */
function createOutlineDistance(outline: SearchOutline) {
  const pieces = outline.pieces, n = pieces.length;
  const index = new Flatbush(Math.max(1, n));
  for (const p of pieces) index.add(...pieceBox(p));
  if (n === 0) index.add(0, 0, 0, 0);
  index.finish();
  const near: number[] = [], nearD: number[] = [];
  const nearest = (x: number, y: number, keep: number) => {
    near.length = 0; nearD.length = 0;
    if (n === 0) return Infinity;
    const d0 = distToPiece(pieces[index.neighbors(x, y, 1)[0]!]!, x, y);
    for (const i of index.search(x - d0, y - d0, x + d0, y + d0)) {
      const d = distToPiece(pieces[i]!, x, y);
      if (near.length === keep && d >= nearD[keep - 1]!) continue;
      let k = Math.min(near.length, keep - 1);
      near[k] = i; nearD[k] = d;
      while (k > 0 && nearD[k - 1]! > d) { near[k] = near[k - 1]!; nearD[k] = nearD[k - 1]!; near[k - 1] = i; nearD[k - 1] = d; k--; }
    }
    return nearD[0] ?? d0;
  };
  const inside = (x: number, y: number) => {
    let odd = false;
    for (const i of index.search(x, y, index.maxX, y)) {
      const cx = crossingX(pieces[i]!, y);
      if (cx !== null && x < cx) odd = !odd;
    }
    return odd;
  };
  const slack = 1e-12 * (Math.abs(index.minX) + Math.abs(index.minY) + Math.abs(index.maxX) + Math.abs(index.maxY));
  return {
    distance: (x: number, y: number) => nearest(x, y, 1),
    /** Signed distance (positive inside) at the cell's centre and an upper bound over the cell. */
    signedWithBound: (x: number, y: number, h: number) => {
      const d = nearest(x, y, BOUND_PIECES);
      const f = inside(x, y) ? d : -d;
      let upper = f + h * Math.SQRT2;
      const gs: [number, number, number][] = [];
      for (const i of near) { const g = linearUpperBound(pieces[i]!, x, y, h); if (g) gs.push(g); }
      if (gs.length > 0) upper = Math.min(upper, maxOfMinLinear(gs, x, y, h) + slack);
      return { f, upper };
    },
  };
}

/**
 * Largest distance from a point to the outline, exact: the pieces are grouped in runs of
 * FARTHEST_RUN with their boxes; runs are scanned in order of the farthest corner of their box
 * (an upper bound) until that bound falls below the best distance found.
 */
const FARTHEST_RUN = 32;
function createFarthestDistance(outline: SearchOutline): (x: number, y: number) => number {
  const pieces = outline.pieces;
  const runs: [number, number, number, number, number][] = [];
  for (let s = 0; s < pieces.length; s += FARTHEST_RUN) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let k = s; k < Math.min(pieces.length, s + FARTHEST_RUN); k++) {
      const [x0, y0, x1, y1] = pieceBox(pieces[k]!);
      minX = Math.min(minX, x0); minY = Math.min(minY, y0); maxX = Math.max(maxX, x1); maxY = Math.max(maxY, y1);
    }
    runs.push([s, minX, minY, maxX, maxY]);
  }
  const bounds = new Float64Array(runs.length);
  const order = runs.map((_, k) => k);
  return (x, y) => {
    runs.forEach(([, minX, minY, maxX, maxY], k) => {
      bounds[k] = Math.hypot(Math.max(x - minX, maxX - x), Math.max(y - minY, maxY - y));
    });
    order.sort((p, q) => bounds[q]! - bounds[p]!);
    let best = 0;
    for (const k of order) {
      if (bounds[k]! <= best) break;
      const s = runs[k]![0];
      for (let i = s; i < Math.min(pieces.length, s + FARTHEST_RUN); i++) best = Math.max(best, farthestOnPiece(pieces[i]!, x, y));
    }
    return best;
  };
}

// ---------------------------------------------------------------- branch and bound

interface Cell { x: number; y: number; h: number; f: number; bound: number }

/**
 * Best-first branch and bound maximising f over square cells; `evaluate` gives f at a cell's centre
 * and an upper bound of f over the cell. Returns the best point, its value and the largest upper
 * bound left when stopping (≤ best + tol unless capped).
 */
function maximise(evaluate: (x: number, y: number, h: number) => { f: number; upper: number }, box: readonly [number, number, number, number], tol: number, accept: (x: number, y: number, h: number) => boolean) {
  const [minX, minY, maxX, maxY] = box;
  const size = Math.max(maxX - minX, maxY - minY) || 1;
  const heap: Cell[] = [];
  let best = { x: (minX + maxX) / 2, y: (minY + maxY) / 2, f: -Infinity };
  const push = (x: number, y: number, h: number) => {
    if (!accept(x, y, h)) return;
    const { f, upper } = evaluate(x, y, h);
    if (f > best.f) best = { x, y, f };
    const cell = { x, y, h, f, bound: upper };
    heap.push(cell);
    let i = heap.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (heap[p]!.bound >= heap[i]!.bound) break;
      [heap[p], heap[i]] = [heap[i]!, heap[p]!];
      i = p;
    }
  };
  const pop = (): Cell => {
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
  push((minX + maxX) / 2, (minY + maxY) / 2, h0);
  let cells = 0;
  let capped = false;
  while (heap.length > 0) {
    const c = pop();
    if (c.bound - best.f <= tol) {
      heap.length = 0;
      return { ...best, upper: Math.max(best.f, c.bound), capped };
    }
    if (++cells > MAX_ROUNDNESS_CELLS) {
      capped = true;
      return { ...best, upper: c.bound, capped };
    }
    const h = c.h / 2;
    push(c.x - h, c.y - h, h); push(c.x + h, c.y - h, h); push(c.x - h, c.y + h, h); push(c.x + h, c.y + h, h);
  }
  return { ...best, upper: best.f, capped };
}

/**
 * Minimum-zone roundness of an outline, searched inside the smallest enclosing disc of its hull
 * points. F(c) = farthest − nearest is 2-Lipschitz, so the branch and bound is exact up to
 * `errorBound` (its gap); the outline's own deviation δ is the caller's to add.
 */
function minimumZoneOf(outline: SearchOutline, mec: Circle, tolerance?: number) {
  const farthest = createFarthestDistance(outline);
  const tol = tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * 2 * mec.r;
  const { distance } = createOutlineDistance(outline);
  const width = (x: number, y: number) => farthest(x, y) - distance(x, y);
  const r = maximise(
    (x, y, h) => { const f = -width(x, y); return { f, upper: f + 2 * h * Math.SQRT2 }; },
    [mec.x - mec.r, mec.y - mec.r, mec.x + mec.r, mec.y + mec.r], tol,
    (x, y, h) => Math.hypot(x - mec.x, y - mec.y) <= mec.r + h * Math.SQRT2,
  );
  // Clamp the best centre into the disc (cells may overhang it) and re-evaluate.
  let { x, y } = r;
  const dc = Math.hypot(x - mec.x, y - mec.y);
  if (dc > mec.r) { x = mec.x + ((x - mec.x) * mec.r) / dc; y = mec.y + ((y - mec.y) * mec.r) / dc; }
  const value = width(x, y);
  const outer = farthest(x, y);
  return {
    widthMm: value, centreX: x, centreY: y, outerRadiusMm: outer, innerRadiusMm: outer - value,
    errorBoundMm: Math.max(0, value + r.upper), capped: r.capped,
    onSearchRim: Math.hypot(x - mec.x, y - mec.y) >= mec.r * (1 - 1e-6),
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
function inscribedCircleOf(outline: SearchOutline, tolerance?: number) {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of outline.pieces) {
    const [x0, y0, x1, y1] = pieceBox(p);
    minX = Math.min(minX, x0); minY = Math.min(minY, y0); maxX = Math.max(maxX, x1); maxY = Math.max(maxY, y1);
  }
  const tol = tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * Math.hypot(maxX - minX, maxY - minY);
  const { signedWithBound } = createOutlineDistance(outline);
  const r = maximise(signedWithBound, [minX, minY, maxX, maxY], tol, () => true);
  return { radiusMm: r.f, centreX: r.x, centreY: r.y, errorBoundMm: Math.max(0, r.upper - r.f), capped: r.capped };
}

/** Largest inscribed circle of a closed polyline (even-odd inside), to `tolerance`. */
export function getLargestInscribedCircle(points: readonly Pt[], tolerance?: number) {
  return inscribedCircleOf(outlineFromPoints(points), tolerance);
}

/** ∬ w(p)² dA of a closed polyline, exact by horizontal slabs (see the module comment). */
export function getWindingSquaredArea(points: readonly Pt[], extraHeights: readonly number[] = []): number {
  const ys = [...new Set([...points.map((p) => p[1]), ...extraHeights])].sort((a, b) => a - b);
  let total = 0;
  for (let k = 0; k + 1 < ys.length; k++) {
    const y0 = ys[k]!, y1 = ys[k + 1]!;
    const y = (y0 + y1) / 2;
    const xs: [number, number][] = [];
    for (let i = 0, j = points.length - 1; i < points.length; j = i++) {
      const a = points[j]!, b = points[i]!;
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

/** Roundness figures and the convex hull of one contour. */
export interface RoundnessFigures {
  readonly roundness: ContourRoundness;
  readonly hull: ContourHull;
}

const toCircle = (valueMm: number, centreXMm: number, centreYMm: number, errorBoundMm: number): MeasuredCircle =>
  ({ value: { valueMm, centreXMm, centreYMm, errorBoundMm } });

/**
 * All roundness figures of one contour. `selfCrossing` comes from the file's intersections
 * (intersect.ts), computed once per analysis.
 */
export function getRoundness(contour: Contour, metrics: ContourMetrics, selfCrossing: boolean): RoundnessFigures {
  const [a, b, c, d] = metrics.bboxMm;
  const size = Math.hypot(c - a, d - b);
  const poly = getContourPolyline(contour, ROUNDNESS_FLATTENING_RELATIVE * size);
  const hullFigures = getPolylineHull(poly);
  const convexity: Measured = metrics.areaMm2.value === null ? { value: null, reason: metrics.areaMm2.reason }
    : selfCrossing ? { value: null, reason: 'the contour crosses itself, so its net area is not the material area' }
    // The flattened hull lies inside the true one (area short by ≤ areaErrorMm2), so the ratio may
    // exceed 1 by that much; the true ratio never does (the hull contains the contour).
    : hullFigures.areaMm2 > 0 ? { value: Math.min(1, metrics.areaMm2.value / hullFigures.areaMm2) } : { value: null, reason: 'the convex hull has no area' };
  const hull: ContourHull = {
    areaMm2: hullFigures.areaMm2, perimeterMm: hullFigures.perimeterMm,
    areaErrorMm2: hullFigures.areaErrorMm2, perimeterErrorMm: hullFigures.perimeterErrorMm, convexity,
  };
  const deficit = metrics.deficitMm2;
  const bonnesen: Measured = selfCrossing
    ? { value: null, reason: 'the contour crosses itself, so the deficit from its net area is meaningless' }
    : deficit.value === null ? { value: null, reason: deficit.reason } : { value: Math.sqrt(Math.max(0, deficit.value)) / Math.PI };
  const undef = (reason: string) => ({ value: null, reason }) as const;
  if (!metrics.closed || size === 0) {
    const why = undef(metrics.closed ? 'the contour has no extent' : 'the contour is not closed');
    return { hull, roundness: { inradius: why, circumradius: why, minZone: why, bonnesenBoundMm: bonnesen, radiusGapMm: why, selfCrossing, windingSquaredAreaMm2: why } };
  }
  const delta = poly.deviationMm;
  const mec = getSmallestEnclosingCircle(hullFigures.points);
  const circumradius = toCircle(mec.r, mec.x, mec.y, delta);
  let windingSquared: Measured = undef('defined for self-crossing contours only; for a simple contour it equals the area');
  if (selfCrossing) {
    windingSquared = poly.points.length > MAX_WINDING_INTEGRAL_VERTICES
      ? undef(`the flattened contour has more than ${MAX_WINDING_INTEGRAL_VERTICES} vertices`)
      : { value: getWindingSquaredArea(poly.points, findSelfIntersections(polylineContour(contour, poly.points)).intersections.map((x) => x.y)) };
  }
  const outline = outlineFromPolyline(poly);
  if (outline.pieces.length > MAX_ROUNDNESS_PIECES) {
    const why = undef(`the flattened contour has ${outline.pieces.length} pieces, more than the ${MAX_ROUNDNESS_PIECES} searched`);
    return { hull, roundness: { inradius: why, circumradius, minZone: why, bonnesenBoundMm: bonnesen, radiusGapMm: why, selfCrossing, windingSquaredAreaMm2: windingSquared } };
  }
  const searchDelta = outline.deviationMm;
  const lic = inscribedCircleOf(outline);
  const inradius = toCircle(lic.radiusMm, lic.centreX, lic.centreY, lic.errorBoundMm + searchDelta);
  let minZone: MeasuredCircle = undef('the contour crosses itself, so it has no inside to zone');
  if (!selfCrossing) {
    const mz = minimumZoneOf(outline, mec);
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
