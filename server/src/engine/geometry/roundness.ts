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
import { getContourPolyline, getPolylineHull } from './hull';

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
/** Most flattened vertices for the inradius and minimum-zone searches. Each of their ≤ MAX_ROUNDNESS_CELLS
 *  cells queries the edge index, but near a medial axis many edges are almost equally far, so a cell
 *  still visits a share of them growing with the vertex count. Above it those figures are undefined
 *  with this reason; the circumradius and hull are still given. */
export const MAX_ROUNDNESS_VERTICES = 2000;

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

// ---------------------------------------------------------------- distances

function distToSegment(x: number, y: number, a: Pt, b: Pt): number {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  let t = l2 === 0 ? 0 : ((x - a[0]) * dx + (y - a[1]) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(x - a[0] - t * dx, y - a[1] - t * dy);
}

/**
 * Distance from a point to a closed polyline and whether the point is inside (even-odd), answered
 * from a flatbush index of the edges, with the same results as scanning every edge:
 * - nearest edge: the edge nearest by box gives an upper bound d0 on the distance; every edge at
 *   distance ≤ d0 has its box within the square of half-side d0, so the minimum over the edges found
 *   there is exact;
 * - inside: an edge that crosses the ray to the right of the point has a box meeting that ray.
 */
export function createPolylineDistance(pts: readonly Pt[]): (x: number, y: number) => { d: number; inside: boolean } {
  const n = pts.length;
  if (n === 0) return () => ({ d: Infinity, inside: false });
  const index = new Flatbush(n);
  for (let i = 0; i < n; i++) {
    const a = pts[(i + n - 1) % n]!, b = pts[i]!;
    index.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
  }
  index.finish();
  const edge = (i: number): [Pt, Pt] => [pts[(i + n - 1) % n]!, pts[i]!];
  return (x, y) => {
    const [near] = index.neighbors(x, y, 1);
    const [a0, b0] = edge(near!);
    const d0 = distToSegment(x, y, a0, b0);
    let d = d0;
    for (const i of index.search(x - d0, y - d0, x + d0, y + d0)) {
      const [a, b] = edge(i);
      d = Math.min(d, distToSegment(x, y, a, b));
    }
    let inside = false;
    for (const i of index.search(x, y, index.maxX, y)) {
      const [a, b] = edge(i);
      if ((a[1] > y) !== (b[1] > y) && x < a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1])) inside = !inside;
    }
    return { d, inside };
  };
}

/**
 * Largest distance from a point to a point set, exact: the points are grouped in runs of
 * FARTHEST_RUN with their boxes; runs are scanned in order of the farthest corner of their box
 * (an upper bound) until that bound falls below the best distance found.
 */
const FARTHEST_RUN = 32;
function createFarthestDistance(pts: readonly Pt[]): (x: number, y: number) => number {
  const runs: [number, number, number, number, number][] = [];
  for (let s = 0; s < pts.length; s += FARTHEST_RUN) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let k = s; k < Math.min(pts.length, s + FARTHEST_RUN); k++) {
      const [px, py] = pts[k]!;
      minX = Math.min(minX, px); minY = Math.min(minY, py); maxX = Math.max(maxX, px); maxY = Math.max(maxY, py);
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
      for (let i = s; i < Math.min(pts.length, s + FARTHEST_RUN); i++) best = Math.max(best, Math.hypot(pts[i]![0] - x, pts[i]![1] - y));
    }
    return best;
  };
}

// ---------------------------------------------------------------- branch and bound

interface Cell { x: number; y: number; h: number; f: number; bound: number }

/**
 * Best-first branch and bound maximising f over square cells (f L-Lipschitz). Returns the best
 * point, its value and the largest upper bound left when stopping (≤ best + tol unless capped).
 */
function maximise(f: (x: number, y: number) => number, lipschitz: number, box: readonly [number, number, number, number], tol: number, accept: (x: number, y: number, h: number) => boolean) {
  const [minX, minY, maxX, maxY] = box;
  const size = Math.max(maxX - minX, maxY - minY) || 1;
  const heap: Cell[] = [];
  const push = (x: number, y: number, h: number) => {
    if (!accept(x, y, h)) return;
    const v = f(x, y);
    const cell = { x, y, h, f: v, bound: v + lipschitz * h * Math.SQRT2 };
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
  let best = { x: (minX + maxX) / 2, y: (minY + maxY) / 2, f: heap[0]?.f ?? -Infinity };
  let cells = 0;
  let capped = false;
  while (heap.length > 0) {
    const c = pop();
    if (c.f > best.f) best = { x: c.x, y: c.y, f: c.f };
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
 * Minimum-zone roundness of a closed polyline (inner distances to its edges) or of a point set
 * (`asPoints`: inner distances to the points, as for measured profiles), searched inside the
 * smallest enclosing disc. Exact up to `errorBound` (the branch-and-bound gap).
 */
export function getMinimumZone(points: readonly Pt[], options: { asPoints?: boolean; tolerance?: number } = {}) {
  const mec = getSmallestEnclosingCircle(points);
  // The farthest point of the outline from any centre is a vertex: the farthest vertex is exact.
  const farthest = createFarthestDistance(points);
  const tol = options.tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * 2 * mec.r;
  const polyline = options.asPoints ? null : createPolylineDistance(points);
  const inner = polyline
    ? (x: number, y: number) => polyline(x, y).d
    : (x: number, y: number) => Math.min(...points.map((p) => Math.hypot(p[0] - x, p[1] - y)));
  const width = (x: number, y: number) => farthest(x, y) - inner(x, y);
  const r = maximise(
    (x, y) => -width(x, y), 2,
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

/** Largest inscribed circle of a closed polyline (even-odd inside), to `tolerance`. */
export function getLargestInscribedCircle(points: readonly Pt[], tolerance?: number) {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of points) { minX = Math.min(minX, x); minY = Math.min(minY, y); maxX = Math.max(maxX, x); maxY = Math.max(maxY, y); }
  const tol = tolerance ?? ROUNDNESS_RELATIVE_TOLERANCE * Math.hypot(maxX - minX, maxY - minY);
  const distance = createPolylineDistance(points);
  const r = maximise((x, y) => {
    const { d, inside } = distance(x, y);
    return inside ? d : -d;
  }, 1, [minX, minY, maxX, maxY], tol, () => true);
  return { radiusMm: r.f, centreX: r.x, centreY: r.y, errorBoundMm: Math.max(0, r.upper - r.f), capped: r.capped };
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
  if (poly.points.length > MAX_ROUNDNESS_VERTICES) {
    const why = undef(`the flattened contour has ${poly.points.length} vertices, more than the ${MAX_ROUNDNESS_VERTICES} searched`);
    return { hull, roundness: { inradius: why, circumradius, minZone: why, bonnesenBoundMm: bonnesen, radiusGapMm: why, selfCrossing, windingSquaredAreaMm2: windingSquared } };
  }
  const lic = getLargestInscribedCircle(poly.points);
  const inradius = toCircle(lic.radiusMm, lic.centreX, lic.centreY, lic.errorBoundMm + delta);
  let minZone: MeasuredCircle = undef('the contour crosses itself, so it has no inside to zone');
  if (!selfCrossing) {
    const mz = getMinimumZone(poly.points);
    minZone = mz.onSearchRim
      ? undef('not round: the shape is elongated, so the best centre lies on the rim of its enclosing circle and no finite minimum zone exists')
      : toCircle(mz.widthMm, mz.centreX, mz.centreY, mz.errorBoundMm + 2 * delta);
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
