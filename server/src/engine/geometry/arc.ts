import type { Arc, Line, SourceSpan } from '../types';

/**
 * Converts an SVG elliptical arc from endpoint parameterisation to the model's centre form.
 *
 * Source: SVG 1.1 Second Edition, Appendix F.6.5 (conversion from endpoint to center
 * parameterization, eqs. F.6.5.1–F.6.5.6) and F.6.6 (correction of out-of-range radii);
 * the same steps are in SVG 2's implementation notes. Deviations, both allowed by the notes:
 * - angle(u, v) is computed as atan2(u × v, u · v) instead of the spec's acos form, which loses
 *   accuracy near ±1 and cannot tell the sign of a half turn;
 * - a tiny negative radicand from rounding is clamped to 0.
 *
 * Returns null when the end points coincide (the spec omits the segment) and a straight `Line`
 * when rx or ry is zero (the spec treats it as a lineto).
 */
export function arcFromSvgEndpoints(
  x1: number, y1: number,
  rxIn: number, ryIn: number,
  phiDeg: number,
  largeArc: boolean, sweepFlag: boolean,
  x2: number, y2: number,
  span: SourceSpan,
): Arc | Line | null {
  const shape = getSvgArcCentre(x1, y1, rxIn, ryIn, phiDeg, largeArc, sweepFlag, x2, y2);
  if (shape === SVG_ARC_NONE) return null;
  if (shape === SVG_ARC_LINE) return { kind: 'line', x0: x1, y0: y1, x1: x2, y1: y2, span };
  const c = svgArcCentre;
  return {
    kind: 'arc',
    x0: x1, y0: y1, x1: x2, y1: y2,
    cx: c[0]!, cy: c[1]!,
    ux: c[2]!, uy: c[3]!,
    vx: c[4]!, vy: c[5]!,
    theta0: c[6]!, sweep: c[7]!,
    span,
  };
}

/** getSvgArcCentre's results: the end points coincide, a radius is zero, or an arc (in svgArcCentre). */
export const SVG_ARC_NONE = 0, SVG_ARC_LINE = 1, SVG_ARC = 2;

/** cx, cy, ux, uy, vx, vy, theta0, sweep of the last arc getSvgArcCentre found (overwritten by each call). */
export const svgArcCentre = new Float64Array(8);

/**
 * The conversion of arcFromSvgEndpoints without building a segment (for readers that map the arc
 * before building it): returns SVG_ARC_NONE, SVG_ARC_LINE or SVG_ARC, and for SVG_ARC writes the
 * centre form into svgArcCentre.
 */
export function getSvgArcCentre(
  x1: number, y1: number,
  rxIn: number, ryIn: number,
  phiDeg: number,
  largeArc: boolean, sweepFlag: boolean,
  x2: number, y2: number,
): number {
  if (x1 === x2 && y1 === y2) return SVG_ARC_NONE;
  let rx = Math.abs(rxIn);
  let ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0) return SVG_ARC_LINE;

  const phi = ((phiDeg % 360) * Math.PI) / 180;
  const cosPhi = Math.cos(phi);
  const sinPhi = Math.sin(phi);
  // F.6.5.1
  const dx2 = (x1 - x2) / 2;
  const dy2 = (y1 - y2) / 2;
  const x1p = cosPhi * dx2 + sinPhi * dy2;
  const y1p = -sinPhi * dx2 + cosPhi * dy2;
  // F.6.6.2–3: scale radii up when no ellipse of the given size reaches both end points.
  const lambda = (x1p * x1p) / (rx * rx) + (y1p * y1p) / (ry * ry);
  if (lambda > 1) {
    const s = Math.sqrt(lambda);
    rx *= s;
    ry *= s;
  }
  // F.6.5.2
  const rx2 = rx * rx;
  const ry2 = ry * ry;
  const den = rx2 * y1p * y1p + ry2 * x1p * x1p;
  const num = rx2 * ry2 - den;
  let coef = lambda >= 1 ? 0 : Math.sqrt(Math.max(0, num / den));
  if (largeArc === sweepFlag) coef = -coef;
  const cxp = (coef * rx * y1p) / ry;
  const cyp = (-coef * ry * x1p) / rx;
  // F.6.5.3
  const cx = cosPhi * cxp - sinPhi * cyp + (x1 + x2) / 2;
  const cy = sinPhi * cxp + cosPhi * cyp + (y1 + y2) / 2;
  // F.6.5.5–6
  const ux = (x1p - cxp) / rx;
  const uy = (y1p - cyp) / ry;
  const vx = (-x1p - cxp) / rx;
  const vy = (-y1p - cyp) / ry;
  const theta0 = Math.atan2(uy, ux);
  let sweep = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  if (!sweepFlag && sweep > 0) sweep -= 2 * Math.PI;
  else if (sweepFlag && sweep < 0) sweep += 2 * Math.PI;
  // A half turn has u × v = ±0 and atan2 returns ±π from the sign of zero; the flag decides.
  if (Math.abs(sweep) === Math.PI) sweep = sweepFlag ? Math.PI : -Math.PI;

  const c = svgArcCentre;
  c[0] = cx; c[1] = cy;
  c[2] = rx * cosPhi; c[3] = rx * sinPhi;
  c[4] = -ry * sinPhi; c[5] = ry * cosPhi;
  c[6] = theta0; c[7] = sweep;
  return SVG_ARC;
}

/** Point of an arc at angle θ: C + U·cos θ + V·sin θ. */
export function getArcPoint(a: Arc, theta: number): [number, number] {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return [a.cx + a.ux * c + a.vx * s, a.cy + a.uy * c + a.vy * s];
}
