/**
 * Hand-built engine results for the adapter's unit tests, so the conversions are tested against
 * figures written in the test (with their formulas), not against the engine's own output.
 */
import { toFigures } from '../../engine/index';
import type { AnalysisFigures, Contour, ContourGeometry, ContourMetrics, ContourResult, FileSummary, Finding, Part, SourceSpan, UnitsInfo } from '../../engine/index';

/** The span of the first occurrence of `needle` in `text` (after `from`); throws when absent. */
export function spanOf(text: string, needle: string, from = 0): SourceSpan {
  const start = text.indexOf(needle, from);
  if (start < 0) throw new Error(`'${needle}' is not in the text`);
  return { start, end: start + needle.length };
}

export function makeContour(fields: Partial<Contour> & Pick<Contour, 'span'>): Contour {
  return {
    index: 0,
    segments: [],
    closed: true,
    startX: 0,
    startY: 0,
    startSpan: fields.span,
    endSpan: fields.span,
    elementSpan: fields.span,
    element: 'path',
    ...fields,
  };
}

/** Metrics of an a × b mm axis-aligned rectangle at the origin, drawn clockwise on screen (SVG, y down). */
export function rectangleMetrics(a: number, b: number): ContourMetrics {
  const perimeter = 2 * (a + b); // rectangle perimeter 2(a+b)
  const area = a * b; // rectangle area ab
  return {
    closed: true,
    gapMm: 0,
    lengthMm: perimeter,
    perimeterMm: { value: perimeter },
    signedAreaMm2: { value: area },
    areaMm2: { value: area },
    orientation: 'cw',
    q: { value: (4 * Math.PI * area) / perimeter ** 2 }, // isoperimetric quotient 4πA/L²
    deficitMm2: { value: perimeter ** 2 - 4 * Math.PI * area }, // isoperimetric deficit L² − 4πA
    bboxMm: [0, 0, a, b],
    segmentCount: 4,
  };
}

/** Metrics of an open polyline of the given drawn length whose end is `gapMm` from its start. */
export function openMetrics(lengthMm: number, gapMm: number, bbox: readonly [number, number, number, number]): ContourMetrics {
  const reason = 'open contour';
  return {
    closed: false,
    gapMm,
    lengthMm,
    perimeterMm: { value: null, reason },
    signedAreaMm2: { value: null, reason },
    areaMm2: { value: null, reason },
    orientation: null,
    q: { value: null, reason },
    deficitMm2: { value: null, reason },
    bboxMm: bbox,
    segmentCount: 2,
  };
}

/** Geometry of the a × b mm rectangle of `rectangleMetrics`, alone in its file. */
export function rectangleGeometry(a: number, b: number): ContourGeometry {
  const perimeter = 2 * (a + b), area = a * b;
  const circumradius = Math.hypot(a, b) / 2; // half the diagonal
  const inradius = Math.min(a, b) / 2; // half the short side
  const deficit = perimeter ** 2 - 4 * Math.PI * area;
  const centre = { centreXMm: a / 2, centreYMm: b / 2, errorBoundMm: 0 };
  return {
    selfIntersections: [],
    overlaps: [],
    parent: null,
    depth: 0,
    roundness: {
      inradius: { value: { valueMm: inradius, ...centre } },
      circumradius: { value: { valueMm: circumradius, ...centre } },
      // Rectangle whose long side is at most twice the short one: zone about the centre, outer = half diagonal, inner = half the short side
      // (REFERENCES.md §3.4, "Rectangle 2×1: centre").
      minZone: { value: { valueMm: circumradius - inradius, ...centre } },
      bonnesenBoundMm: { value: Math.sqrt(deficit) / Math.PI }, // √D/π (REFERENCES.md §1.3)
      radiusGapMm: { value: circumradius - inradius },
      selfCrossing: false,
      windingSquaredAreaMm2: { value: null, reason: 'defined for self-crossing contours only; for a simple contour it equals the area' },
    },
    hull: { areaMm2: area, perimeterMm: perimeter, areaErrorMm2: 0, perimeterErrorMm: 0, convexity: { value: 1 } },
  };
}

/** Geometry of an open contour inside contour `parent` (or none), whose convex hull is given. */
export function openGeometry(hull: { areaMm2: number; perimeterMm: number }, parent: number | null = null): ContourGeometry {
  const reason = 'the contour is not closed';
  const none = { value: null, reason } as const;
  return {
    selfIntersections: [],
    overlaps: [],
    parent,
    depth: parent === null ? 0 : 1,
    roundness: { inradius: none, circumradius: none, minZone: none, bonnesenBoundMm: { value: null, reason: 'open contour' }, radiusGapMm: none, selfCrossing: false, windingSquaredAreaMm2: none },
    hull: { ...hull, areaErrorMm2: 0, perimeterErrorMm: 0, convexity: { value: null, reason: 'open contour' } },
  };
}

/** The file summary by its definitions: one pierce per contour, parts = closed contours at even depth. */
export function summarize(contours: readonly ContourResult[]): FileSummary {
  const parts = contours.filter((c) => c.metrics.closed && c.geometry.depth % 2 === 0);
  return {
    contours: contours.length,
    parts: parts.length,
    pierces: contours.length,
    cutLengthMm: contours.reduce((s, c) => s + c.metrics.lengthMm, 0),
    netAreaMm2: contours.reduce((s, c) => s + (c.metrics.closed ? (c.geometry.depth % 2 === 0 ? 1 : -1) * (c.metrics.areaMm2.value ?? 0) : 0), 0),
  };
}

/** The parts by their definition: each closed contour at even depth with the closed contours one level
 *  deeper whose parent it is; net area outer − holes; holes opposite when every one turns the other way. */
export function partsOf(contours: readonly ContourResult[]): Part[] {
  return contours.filter((c) => c.metrics.closed && c.geometry.depth % 2 === 0).map((outer) => {
    const holes = contours.filter((c) => c.metrics.closed && c.geometry.parent === outer.contour.index && c.geometry.depth % 2 === 1);
    const turns = [outer, ...holes].map((c) => c.metrics.orientation);
    return {
      outer: outer.contour.index,
      holes: holes.map((h) => h.contour.index),
      netAreaMm2: (outer.metrics.areaMm2.value ?? 0) - holes.reduce((s, h) => s + (h.metrics.areaMm2.value ?? 0), 0),
      holesTurnOpposite: turns.includes(null) ? null : turns.slice(1).every((t) => t !== turns[0]),
    };
  });
}

export const MM_UNITS: UnitsInfo = { declared: true, mmPerUnit: 1, assumed: null, span: { start: 0, end: 0 } };
/** CSS px: 1 px = 1/96 in = 25.4/96 mm (CSS Values and Units Level 3, §5.2 absolute lengths). */
export const PX_UNITS: UnitsInfo = { declared: false, mmPerUnit: 25.4 / 96, assumed: 'px', span: { start: 0, end: 0 } };

export function makeResult(
  contours: readonly ContourResult[],
  findings: readonly Finding[] = [],
  units: UnitsInfo = MM_UNITS,
): AnalysisFigures {
  return toFigures({ format: 'svg', yAxis: 'down', units, contours, summary: summarize(contours), parts: partsOf(contours), findings });
}
