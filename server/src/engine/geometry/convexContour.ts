/**
 * The hull of a contour that turns one way, in closed form.
 *
 * A closed curve whose tangent turns monotonically, through one full turn in all, is convex and
 * bounds a convex region [src: do Carmo, *Differential Geometry of Curves and Surfaces*, 1976, §1-7
 * (a closed plane curve with rotation index 1 and curvature of one sign is convex; corners count as
 * turns) — from memory]. Such a contour is its own hull: the hull's area is the contour's area and
 * its perimeter the contour's length, in closed form (Green's theorem, area.ts; the measures' lengths,
 * exact for lines and arcs, Béziers' within BEZIER_LENGTH_REL_TOL) where flattening (hull.ts) leaves
 * an error of δ·P. An open contour's hull is that of the
 * closed curve its chord from end to start completes, since the chord lies in the hull.
 *
 * An arc of an ellipse turns one way (the sign of sweep·(U × V)); a Bézier is taken when its control
 * polygon turns one way through less than a half turn (addBezier), else the contour gives up, as it
 * does for joints turning against the others by more than MAX_KINK_RAD in all, a cusp, or a
 * turning number other than one. Turns are computed from tangents in floating point, so a joint where
 * two pieces meet tangentially (a rounded corner) may come out a hair concave; such kinks, each
 * widened by its rounding allowance, add up to E, and gaps between consecutive pieces shorter than
 * JOINT_GAP_RELATIVE of the size (arc ends rounded away from a line's end) are taken as joints and
 * add up to G. Then, with P the length of the closed curve [derived here]: between two points where
 * the curve leaves and meets its hull, the tangent stays within E of the hull edge's direction, so
 * the curve there lies within ℓ·sin E + G of that edge (ℓ the length between them) and is longer than
 * it by at most ℓ·E²/2 + 2G. Hence the hull's area lies in [A, A + P²·sin E / 4 + P·G] and its
 * perimeter in [P − P·E²/2 − 2G, P], widened by the Béziers' length tolerance; both are the stated
 * bounds (0 for lines and arcs when no joint needed either).
 */
import type { Contour, ContourMetrics, Cubic, Quad } from '../types';
import { CompensatedSum, getSegmentArea } from './area';
import type { HullMeasures } from './hull';
import { getVectorLength } from './length';
import { getSegmentAt, getSegmentCount, SegmentView } from '../model/packedSegment';
import { BEZIER_LENGTH_REL_TOL } from './tolerances';

/** Largest concave turn (rad) at a joint still taken as rounding of a tangential joint; a larger one
 *  is a notch, and the contour goes to the flattened hull. [common practice, no source] */
export const MAX_KINK_RAD = 1e-9;
/** Gaps between consecutive pieces up to this fraction of the contour's size (bbox diagonal) are
 *  joints; longer ones are chords of the curve. [common practice, no source] */
export const JOINT_GAP_RELATIVE = 1e-7;

const EPS = 2 ** -52;
const TWO_PI = 2 * Math.PI;

/**
 * atan2(cross, dot): the angle turned from one direction to another. A finely divided curve turns by
 * tiny angles at nearly every joint, where atan t = t − t³/3 + t⁵/5 − … is exact to rounding for
 * |t| < 1e-4 (the next term is below 2e-21 of it) at a fraction of atan2's cost.
 */
function turnAngle(cross: number, dot: number): number {
  if (dot > 0 && Math.abs(cross) < 1e-4 * dot) {
    const t = cross / dot;
    return t - (t * t * t) / 3;
  }
  return Math.atan2(cross, dot);
}

/** Walks a contour's tangents, joint by joint, for one orientation and the other at once. */
class TurnWalk {
  /** Sum of every turn (joints and arcs), signed: ±2π for a convex contour. */
  total = 0;
  /** Sum of allowance − turn over the joints turning against the positive / negative orientation. */
  againstPositive = 0;
  againstNegative = 0;
  /** An arc or a joint turns clearly against that orientation. */
  badPositive = false;
  badNegative = false;
  cusp = false;
  private started = false;
  private firstX = 0; private firstY = 0; private firstNoise = 0;
  private lastX = 0; private lastY = 0; private lastNoise = 0;

  /** Back to no pieces. */
  reset(): void {
    this.total = this.againstPositive = this.againstNegative = 0;
    this.badPositive = this.badNegative = this.cusp = this.started = false;
  }

  /** A piece with these start and end tangents (any length) and the rounding noise (rad) of their directions. */
  piece(sx: number, sy: number, ex: number, ey: number, noise: number): void {
    if (this.started) this.joint(this.lastX, this.lastY, this.lastNoise, sx, sy, noise);
    else { this.started = true; this.firstX = sx; this.firstY = sy; this.firstNoise = noise; }
    this.lastX = ex; this.lastY = ey; this.lastNoise = noise;
  }

  /** An arc's own turn, of the given sign. */
  arcTurn(turn: number): void {
    this.total += turn;
    if (turn > 0) this.badNegative = true;
    else if (turn < 0) this.badPositive = true;
  }

  /** Closes the walk: the joint from the last piece back to the first. */
  close(): void {
    if (this.started) this.joint(this.lastX, this.lastY, this.lastNoise, this.firstX, this.firstY, this.firstNoise);
  }

  private joint(ax: number, ay: number, an: number, bx: number, by: number, bn: number): void {
    const turn = turnAngle(ax * by - ay * bx, ax * bx + ay * by);
    if (Math.abs(turn) > Math.PI - 1e-6) this.cusp = true;
    this.total += turn;
    const allowance = an + bn + 4 * EPS;
    if (turn < allowance) {
      this.againstPositive += allowance - turn;
      if (turn < -MAX_KINK_RAD) this.badPositive = true;
    }
    if (-turn < allowance) {
      this.againstNegative += allowance + turn;
      if (turn > MAX_KINK_RAD) this.badNegative = true;
    }
  }
}

/**
 * The walk along a contour from its start (ox, oy): its turns, its area from the start, and the gaps
 * it bridges between one piece's end and the next one's start. One is reused for every contour
 * (`start` resets it): its numbers change in place, where a closure's or a fresh object's would
 * each be a new heap number (~600 B a small contour, a quarter of a million of them in a big drawing).
 */
class PathWalk {
  readonly walk = new TurnWalk();
  area = new CompensatedSum();
  /** Lengths of the gaps bridged between pieces: all, and those taken as joints. */
  bridged = 0;
  gaps = 0;
  /** The last piece's end. */
  endX = 0;
  endY = 0;
  private ox = 0;
  private oy = 0;
  private jointGap = 0;

  start(ox: number, oy: number, jointGap: number): this {
    this.walk.reset();
    this.area = new CompensatedSum();
    this.bridged = this.gaps = 0;
    this.endX = this.ox = ox; this.endY = this.oy = oy;
    this.jointGap = jointGap;
    return this;
  }

  /** The curve from the last end to (x, y): a joint when short, else a chord of the curve. */
  bridge(x: number, y: number): void {
    const { endX, endY, ox, oy } = this;
    const dx = x - endX, dy = y - endY, g = getVectorLength(dx, dy);
    if (g === 0) return;
    this.bridged += g;
    this.area.add(((endX - ox) * (y - oy) - (endY - oy) * (x - ox)) / 2);
    if (g <= this.jointGap) this.gaps += g;
    else this.walk.piece(dx, dy, dx, dy, 4 * EPS);
  }
}

const pathWalk = new PathWalk();

/** Bézier control turns up to this (rad) are taken as rounding of collinear control points. */
const STRAIGHT_RAD = 1e-12;

/**
 * Walks a Bézier's control polygon: its steps (nonzero differences of consecutive control points) as
 * pieces, so the walk sees the turns between them. Its hodograph is the Bézier of those steps, so when
 * they all turn one way through less than a half turn, the curve's tangent stays in their cone and
 * turns monotonically from the first to the last [src: convex-hull property of Bézier curves applied
 * to the derivative, Farin, *Curves and Surfaces for CAGD*, 5th ed. 2002, §4.3 and §5.3 — from
 * memory]: then the steps' turns are the curve's. False when they do not (an inflection may lie
 * between): the contour is left to the flattened hull.
 */
function addBezier(s: Quad | Cubic, walk: TurnWalk): boolean {
  const xs = s.kind === 'quad' ? [s.x0, s.x1, s.x2] : [s.x0, s.x1, s.x2, s.x3];
  const ys = s.kind === 'quad' ? [s.y0, s.y1, s.y2] : [s.y0, s.y1, s.y2, s.y3];
  let px = 0, py = 0, started = false, span = 0, sign = 0;
  for (let i = 1; i < xs.length; i++) {
    const dx = xs[i]! - xs[i - 1]!, dy = ys[i]! - ys[i - 1]!;
    if (dx === 0 && dy === 0) continue;
    if (started) {
      const turn = Math.atan2(px * dy - py * dx, px * dx + py * dy);
      if (Math.abs(turn) > STRAIGHT_RAD) {
        if (sign !== 0 && Math.sign(turn) !== sign) return false;
        sign = Math.sign(turn);
      }
      span += turn;
    }
    started = true;
    px = dx; py = dy;
  }
  if (!(Math.abs(span) < Math.PI - 1e-6)) return false;
  for (let i = 1; i < xs.length; i++) {
    const dx = xs[i]! - xs[i - 1]!, dy = ys[i]! - ys[i - 1]!;
    if (dx !== 0 || dy !== 0) walk.piece(dx, dy, dx, dy, 4 * EPS);
  }
  return true;
}

/** The segment getConvexContourHull looks at, for a contour whose segments are stored. */
const segmentView = new SegmentView();

/**
 * The hull measures of a contour that turns one way (see the module comment), or null when it does
 * not (or its turns cannot be told: a Bézier whose control polygon does not turn one way) or has no
 * extent. The length is the measures' own (`metrics`, whose lengths are exact for lines and arcs and
 * within BEZIER_LENGTH_REL_TOL for Béziers) plus the gaps bridged between pieces, so no segment is
 * measured twice; a self-crossing contour is never convex, and the caller need not ask.
 */
export function getConvexContourHull(contour: Contour, metrics: ContourMetrics): HullMeasures | null {
  const [minX, minY, maxX, maxY] = metrics.bboxMm;
  const sizeMm = getVectorLength(maxX - minX, maxY - minY);
  if (!(sizeMm > 0) || !Number.isFinite(sizeMm)) return null;
  const { startX: ox, startY: oy } = contour;
  const count = getSegmentCount(contour);
  const path = pathWalk.start(ox, oy, JOINT_GAP_RELATIVE * sizeMm);
  const { walk, area } = path;
  let hasBezier = false;
  for (let i = 0; i < count; i++) {
    const s = getSegmentAt(contour, i, segmentView);
    path.bridge(s.x0, s.y0);
    if (s.kind === 'quad' || s.kind === 'cubic') {
      path.endX = s.kind === 'quad' ? s.x2 : s.x3; path.endY = s.kind === 'quad' ? s.y2 : s.y3;
      if (!addBezier(s, walk)) return null;
      hasBezier = true;
      area.add(getSegmentArea(s, ox, oy));
      if (walk.badPositive && walk.badNegative) return null;
      continue;
    }
    path.endX = s.x1; path.endY = s.y1;
    if (s.kind === 'line') {
      const dx = s.x1 - s.x0, dy = s.y1 - s.y0;
      if (dx === 0 && dy === 0) continue;
      area.add(getSegmentArea(s, ox, oy));
      walk.piece(dx, dy, dx, dy, 4 * EPS);
      if (walk.badPositive && walk.badNegative) return null;
      continue;
    }
    if (s.sweep === 0) continue;
    const { ux, uy, vx, vy, sweep } = s;
    const cross = ux * vy - uy * vx, extent = getVectorLength(ux, uy) + getVectorLength(vx, vy);
    if (!(Math.abs(cross) > 1e-12 * extent * extent) || Math.abs(sweep) > TWO_PI) return null;
    // Tangents P′(θ) = −U sin θ + V cos θ, in the direction of travel.
    const t0 = s.theta0, t1 = t0 + sweep, dir = Math.sign(sweep);
    const sx = dir * (vx * Math.cos(t0) - ux * Math.sin(t0)), sy = dir * (vy * Math.cos(t0) - uy * Math.sin(t0));
    const ex = dir * (vx * Math.cos(t1) - ux * Math.sin(t1)), ey = dir * (vy * Math.cos(t1) - uy * Math.sin(t1));
    const slow = Math.min(getVectorLength(sx, sy), getVectorLength(ex, ey));
    // Rounding of the tangents: the products and sums (a few ε of |U| + |V|), and θ1's rounding moving
    // the end along the arc.
    const noise = 8 * EPS * (extent / slow) * (1 + (Math.abs(t0) + Math.abs(sweep)) * (extent / slow));
    if (!(noise < MAX_KINK_RAD)) return null;
    // The tangent turns monotonically by |sweep| in the parameter: π over a half turn of it, so the
    // angle between the end tangents is the turn for |sweep| ≤ π and its complement beyond.
    const between = Math.abs(Math.atan2(sx * ey - sy * ex, sx * ex + sy * ey));
    const magnitude = Math.abs(sweep) <= Math.PI ? between : TWO_PI - between;
    area.add(getSegmentArea(s, ox, oy));
    walk.piece(sx, sy, ex, ey, noise);
    walk.arcTurn(Math.sign(sweep) * Math.sign(cross) * magnitude);
    // Turns clearly both ways: no need to walk the rest (a wavy outline of a million pieces stops early).
    if (walk.badPositive && walk.badNegative) return null;
  }
  // The measures' length holds the closing chord of a closed contour; an open one's is its gap.
  const closing = getVectorLength(ox - path.endX, oy - path.endY);
  path.bridge(ox, oy);
  const { bridged, gaps } = path;
  walk.close();
  if (walk.cusp || !(Math.abs(Math.abs(walk.total) - TWO_PI) < 1e-6)) return null;
  const positive = walk.total > 0;
  if (positive ? walk.badPositive : walk.badNegative) return null;
  const against = positive ? walk.againstPositive : walk.againstNegative;
  // So many near-tangential joints that their allowances add up: the flattened hull bounds it better.
  if (!(against < MAX_KINK_RAD)) return null;
  const p = metrics.lengthMm + bridged - (metrics.closed ? closing : 0), a = Math.abs(area.value);
  if (!Number.isFinite(p) || !Number.isFinite(a)) return null;
  // Bézier lengths are known to BEZIER_LENGTH_REL_TOL either way (taken of the whole length here).
  const lengthError = hasBezier ? BEZIER_LENGTH_REL_TOL * p : 0;
  const perimeterErrorMm = (p * against * against) / 2 + 2 * gaps + 2 * lengthError;
  return {
    areaMm2: a,
    perimeterMm: p + lengthError - perimeterErrorMm,
    areaErrorMm2: (p * p * Math.sin(Math.min(against, Math.PI / 2))) / 4 + p * gaps,
    perimeterErrorMm,
  };
}
