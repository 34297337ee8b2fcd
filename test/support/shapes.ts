/**
 * Builders of model segments and contours for tests, with dummy source spans: regular polygons,
 * rectangles, circles and ellipses from arcs, the four-cubic "circle", contours from SVG path data
 * (parsed by the independent npm package svg-path-parser), and the rigid/affine maps the property
 * tests use. Coordinates are taken as millimetres.
 */
import { createRequire } from 'node:module';
import { arcFromSvgEndpoints } from '../../server/src/engine/geometry/arc';
import { getTransientPolyline, type Polyline } from '../../server/src/engine/geometry/hull';
import type { Arc, Contour, Cubic, Line, Quad, Segment, SourceSpan } from '../../server/src/engine/types';

export const DUMMY_SPAN: SourceSpan = { start: 0, end: 0 };

export function line(x0: number, y0: number, x1: number, y1: number): Line {
  return { kind: 'line', x0, y0, x1, y1, span: DUMMY_SPAN };
}

export function quad(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number): Quad {
  return { kind: 'quad', x0, y0, x1, y1, x2, y2, span: DUMMY_SPAN };
}

export function cubic(
  x0: number, y0: number, x1: number, y1: number,
  x2: number, y2: number, x3: number, y3: number,
): Cubic {
  return { kind: 'cubic', x0, y0, x1, y1, x2, y2, x3, y3, span: DUMMY_SPAN };
}

/** Arc P(θ) = C + U cos θ + V sin θ, θ from theta0 to theta0 + sweep; end points evaluated. */
export function arc(
  cx: number, cy: number, ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number,
): Arc {
  const at = (t: number): [number, number] => [
    cx + ux * Math.cos(t) + vx * Math.sin(t),
    cy + uy * Math.cos(t) + vy * Math.sin(t),
  ];
  const [x0, y0] = at(theta0);
  const [x1, y1] = Math.abs(sweep) === 2 * Math.PI ? [x0, y0] : at(theta0 + sweep);
  return { kind: 'arc', x0, y0, x1, y1, cx, cy, ux, uy, vx, vy, theta0, sweep, span: DUMMY_SPAN };
}

/** A contour of the given segments; starts at the first segment's start (or at `start` when empty). */
export function contourFromSegments(
  segments: readonly Segment[],
  closed: boolean,
  start: readonly [number, number] = [0, 0],
): Contour {
  const first = segments[0];
  return {
    index: 0,
    segments,
    closed,
    startX: first ? first.x0 : start[0],
    startY: first ? first.y0 : start[1],
    span: DUMMY_SPAN,
    startSpan: DUMMY_SPAN,
    endSpan: DUMMY_SPAN,
    elementSpan: DUMMY_SPAN,
    element: 'path',
  };
}

/**
 * Lines through the points; when `explicitClose` a last line returns to the first point (as a
 * polygon or `L` back to the start before `Z`), else the contour relies on its closing chord.
 */
export function polygonSegments(points: readonly (readonly [number, number])[], explicitClose: boolean): Line[] {
  const segments: Line[] = [];
  const n = points.length;
  for (let i = 0; i + 1 < n; i++) segments.push(line(points[i]![0], points[i]![1], points[i + 1]![0], points[i + 1]![1]));
  if (explicitClose && n > 1) segments.push(line(points[n - 1]![0], points[n - 1]![1], points[0]![0], points[0]![1]));
  return segments;
}

/** Vertices of a regular n-gon with circumradius r, counter-clockwise in y-up axes. */
export function regularPolygonPoints(n: number, r: number, cx = 0, cy = 0, phase = 0): [number, number][] {
  return Array.from({ length: n }, (_, i) => {
    const a = phase + (2 * Math.PI * i) / n;
    return [cx + r * Math.cos(a), cy + r * Math.sin(a)] as [number, number];
  });
}

/** Axis-aligned rectangle, counter-clockwise in y-up axes, closed by an explicit last line. */
export function rectangleSegments(x: number, y: number, w: number, h: number): Line[] {
  return polygonSegments([[x, y], [x + w, y], [x + w, y + h], [x, y + h]], true);
}

/** Circle of radius r as one full-turn arc or as two half-turn arcs (counter-clockwise in y-up). */
export function circleArcs(cx: number, cy: number, r: number, pieces: 1 | 2): Arc[] {
  if (pieces === 1) return [arc(cx, cy, r, 0, 0, r, 0, 2 * Math.PI)];
  const first = arc(cx, cy, r, 0, 0, r, 0, Math.PI);
  const second = arc(cx, cy, r, 0, 0, r, Math.PI, Math.PI);
  // Share the exact end points, as a reader would.
  return [
    { ...first, x1: cx - r, y1: cy },
    { ...second, x0: cx - r, y0: cy, x1: cx + r, y1: cy },
  ];
}

/** Full ellipse with semi-axes a (along x) and b (along y) as one arc: U = (a, 0), V = (0, b). */
export function ellipseArc(cx: number, cy: number, a: number, b: number): Arc {
  return arc(cx, cy, a, 0, 0, b, 0, 2 * Math.PI);
}

/** Handle length of the four-cubic circle, k = 4(√2 − 1)/3 (REFERENCES §2.10). */
export const CIRCLE_CUBIC_K = (4 * (Math.SQRT2 - 1)) / 3;

/** The usual "circle" of four cubic Béziers, radius r, counter-clockwise in y-up (REFERENCES §2.10). */
export function fourCubicCircle(cx: number, cy: number, r: number): Cubic[] {
  const k = CIRCLE_CUBIC_K * r;
  return [
    cubic(cx + r, cy, cx + r, cy + k, cx + k, cy + r, cx, cy + r),
    cubic(cx, cy + r, cx - k, cy + r, cx - r, cy + k, cx - r, cy),
    cubic(cx - r, cy, cx - r, cy - k, cx - k, cy - r, cx, cy - r),
    cubic(cx, cy - r, cx + k, cy - r, cx + r, cy - k, cx + r, cy),
  ];
}

// ---- SVG path data, parsed by svg-path-parser (an independent reference parser) ----

interface ParsedCommand {
  code: string;
  x?: number; y?: number; x0: number; y0: number;
  x1?: number; y1?: number; x2?: number; y2?: number;
  rx?: number; ry?: number; xAxisRotation?: number; largeArc?: boolean; sweep?: boolean;
}
const svgPathParser = createRequire(import.meta.url)('svg-path-parser') as {
  parseSVG(d: string): unknown[];
  makeAbsolute(commands: unknown[]): ParsedCommand[];
};

interface ControlPoint {
  readonly kind: 'quad' | 'cubic';
  readonly x: number;
  readonly y: number;
}

/**
 * Contours of an SVG path's `d`, one per subpath, built with svg-path-parser's absolute commands
 * and this project's arc conversion (S/T reflect the previous control point, SVG 2 Paths §9.3.6–7).
 */
export function contoursFromPathData(d: string): Contour[] {
  const contours: Contour[] = [];
  let segments: Segment[] = [];
  let start: [number, number] = [0, 0];
  let lastControl: ControlPoint | null = null;
  // S and T: the previous control point mirrored in the current point, if the previous command was
  // of the same family; else the current point itself.
  const reflect = (kind: ControlPoint['kind'], x0: number, y0: number): [number, number] =>
    lastControl !== null && lastControl.kind === kind ? [2 * x0 - lastControl.x, 2 * y0 - lastControl.y] : [x0, y0];
  const flush = (closed: boolean) => {
    if (segments.length > 0 || closed) contours.push({ ...contourFromSegments(segments, closed, start), index: contours.length });
    segments = [];
  };
  for (const c of svgPathParser.makeAbsolute(svgPathParser.parseSVG(d))) {
    const { x0, y0 } = c;
    const x = c.x ?? x0, y = c.y ?? y0;
    let control: ControlPoint | null = null;
    switch (c.code) {
      case 'M':
        flush(false);
        start = [x, y];
        break;
      case 'L': case 'H': case 'V':
        segments.push(line(x0, y0, x, y));
        break;
      case 'Q': case 'T': {
        const [qx, qy]: [number, number] = c.code === 'Q' ? [c.x1!, c.y1!] : reflect('quad', x0, y0);
        segments.push(quad(x0, y0, qx, qy, x, y));
        control = { kind: 'quad', x: qx, y: qy };
        break;
      }
      case 'C': case 'S': {
        const [ax, ay]: [number, number] = c.code === 'C' ? [c.x1!, c.y1!] : reflect('cubic', x0, y0);
        segments.push(cubic(x0, y0, ax, ay, c.x2!, c.y2!, x, y));
        control = { kind: 'cubic', x: c.x2!, y: c.y2! };
        break;
      }
      case 'A': {
        const a = arcFromSvgEndpoints(x0, y0, c.rx!, c.ry!, c.xAxisRotation!, c.largeArc!, c.sweep!, x, y, DUMMY_SPAN);
        if (a) segments.push(a);
        break;
      }
      case 'Z':
        flush(true);
        start = [x, y];
        break;
    }
    lastControl = control;
  }
  flush(false);
  return contours;
}

// ---- Maps used by property tests ----

/** Image of a segment under p ↦ (a·x + c·y + e, b·x + d·y + f); arcs map C as a point, U and V as vectors. */
export function mapSegment(s: Segment, [a, b, c, d, e, f]: readonly [number, number, number, number, number, number]): Segment {
  const px = (x: number, y: number) => a * x + c * y + e;
  const py = (x: number, y: number) => b * x + d * y + f;
  switch (s.kind) {
    case 'line':
      return line(px(s.x0, s.y0), py(s.x0, s.y0), px(s.x1, s.y1), py(s.x1, s.y1));
    case 'quad':
      return quad(px(s.x0, s.y0), py(s.x0, s.y0), px(s.x1, s.y1), py(s.x1, s.y1), px(s.x2, s.y2), py(s.x2, s.y2));
    case 'cubic':
      return cubic(
        px(s.x0, s.y0), py(s.x0, s.y0), px(s.x1, s.y1), py(s.x1, s.y1),
        px(s.x2, s.y2), py(s.x2, s.y2), px(s.x3, s.y3), py(s.x3, s.y3),
      );
    case 'arc':
      return {
        ...s,
        x0: px(s.x0, s.y0), y0: py(s.x0, s.y0), x1: px(s.x1, s.y1), y1: py(s.x1, s.y1),
        cx: px(s.cx, s.cy), cy: py(s.cx, s.cy),
        ux: a * s.ux + c * s.uy, uy: b * s.ux + d * s.uy,
        vx: a * s.vx + c * s.vy, vy: b * s.vx + d * s.vy,
      };
  }
}

/** The same curve run backwards. */
export function reverseSegment(s: Segment): Segment {
  switch (s.kind) {
    case 'line':
      return line(s.x1, s.y1, s.x0, s.y0);
    case 'quad':
      return quad(s.x2, s.y2, s.x1, s.y1, s.x0, s.y0);
    case 'cubic':
      return cubic(s.x3, s.y3, s.x2, s.y2, s.x1, s.y1, s.x0, s.y0);
    case 'arc':
      return { ...s, x0: s.x1, y0: s.y1, x1: s.x0, y1: s.y0, theta0: s.theta0 + s.sweep, sweep: -s.sweep };
  }
}

export function mapContour(contour: Contour, m: readonly [number, number, number, number, number, number]): Contour {
  const [a, b, c, d, e, f] = m;
  return {
    ...contourFromSegments(contour.segments.map((s) => mapSegment(s, m)), contour.closed),
    startX: a * contour.startX + c * contour.startY + e,
    startY: b * contour.startX + d * contour.startY + f,
  };
}

/** A loop (last end = start) run backwards. */
export function reverseContour(contour: Contour): Contour {
  return contourFromSegments([...contour.segments].reverse().map(reverseSegment), contour.closed);
}

/** A loop (last end = start) started at its k-th segment. */
export function rotateContourStart(contour: Contour, k: number): Contour {
  const segs = contour.segments;
  return contourFromSegments([...segs.slice(k), ...segs.slice(0, k)], contour.closed);
}

/** A plain copy of any segment (a packed one included): its fields in declaration order, for comparisons. */
export function toPlainSegment(s: Segment): Segment {
  switch (s.kind) {
    case 'line': return { kind: 'line', x0: s.x0, y0: s.y0, x1: s.x1, y1: s.y1, span: s.span };
    case 'quad': return { kind: 'quad', x0: s.x0, y0: s.y0, x1: s.x1, y1: s.y1, x2: s.x2, y2: s.y2, span: s.span };
    case 'cubic': return { kind: 'cubic', x0: s.x0, y0: s.y0, x1: s.x1, y1: s.y1, x2: s.x2, y2: s.y2, x3: s.x3, y3: s.y3, span: s.span };
    case 'arc': return {
      kind: 'arc', x0: s.x0, y0: s.y0, x1: s.x1, y1: s.y1, cx: s.cx, cy: s.cy,
      ux: s.ux, uy: s.uy, vx: s.vx, vy: s.vy, theta0: s.theta0, sweep: s.sweep, span: s.span,
    };
  }
}

/** The contour's flattening (hull.ts `getTransientPolyline`) in arrays of its own, for tests that keep several. */
export function getContourPolyline(contour: Contour, toleranceMm: number): Polyline {
  const p = getTransientPolyline(contour, toleranceMm);
  return {
    ...p, xs: p.xs.slice(), ys: p.ys.slice(),
    pieceFirst: p.pieceFirst.slice(), pieceSegment: p.pieceSegment.slice(), pieceOnCircle: p.pieceOnCircle.slice(),
  };
}
