import type { StoredSegments } from './model/packedSegment';

/**
 * The engine's public data types: what the readers build, what the checks see and what the
 * adapters (language server, CLI) consume. Plain data only — no editor or protocol types here.
 *
 * Conventions (stated once, here):
 * - Offsets are UTF-16 code-unit offsets into the analysed text; a span is half-open [start, end).
 * - Model coordinates are millimetres after import, in the file's own axes: SVG y points down from
 *   the top-left corner of the outermost viewport; DXF y points up (drawing axes).
 * - Signed area is A = ½∮(x dy − y dx) in those axes. It is positive for a loop that turns
 *   counter-clockwise in y-up axes, i.e. a loop that looks CLOCKWISE on screen in an SVG (y down).
 * - Curve parameters are t ∈ [0, 1]; arc angles are radians.
 */

/** Half-open range [start, end) of UTF-16 code-unit offsets into the analysed text. */
export interface SourceSpan {
  readonly start: number;
  readonly end: number;
}

export type Severity = 'error' | 'warning' | 'info';
export type SeveritySetting = Severity | 'off';

export type FileFormat = 'svg' | 'dxf';

/** Direction of the y axis of a file's own coordinates. */
export type YAxis = 'down' | 'up';

/** Straight segment from (x0, y0) to (x1, y1). */
export interface Line {
  readonly kind: 'line';
  readonly x0: number; readonly y0: number;
  readonly x1: number; readonly y1: number;
  readonly span: SourceSpan;
}

/** Quadratic Bézier with control points P0, P1, P2. */
export interface Quad {
  readonly kind: 'quad';
  readonly x0: number; readonly y0: number;
  readonly x1: number; readonly y1: number;
  readonly x2: number; readonly y2: number;
  readonly span: SourceSpan;
}

/** Cubic Bézier with control points P0, P1, P2, P3. */
export interface Cubic {
  readonly kind: 'cubic';
  readonly x0: number; readonly y0: number;
  readonly x1: number; readonly y1: number;
  readonly x2: number; readonly y2: number;
  readonly x3: number; readonly y3: number;
  readonly span: SourceSpan;
}

/**
 * Elliptical arc in conjugate-diameter form: P(θ) = C + U·cos θ + V·sin θ for θ running from
 * `theta0` to `theta0 + sweep` (radians, sweep signed, |sweep| ≤ 2π). U and V are conjugate
 * semi-diameters, so an affine image of an arc is again an `Arc` (map C as a point, U and V as
 * vectors). For an SVG arc, U = rx·(cos φ, sin φ) and V = ry·(−sin φ, cos φ).
 * (x0, y0) and (x1, y1) are the end points as read from the file (exact), not re-evaluated.
 */
export interface Arc {
  readonly kind: 'arc';
  readonly x0: number; readonly y0: number;
  readonly x1: number; readonly y1: number;
  readonly cx: number; readonly cy: number;
  readonly ux: number; readonly uy: number;
  readonly vx: number; readonly vy: number;
  readonly theta0: number;
  readonly sweep: number;
  readonly span: SourceSpan;
}

export type Segment = Line | Quad | Cubic | Arc;

/** A replacement of the text in `span` by `newText`. */
export interface TextEdit {
  readonly span: SourceSpan;
  readonly newText: string;
}

/** A quick fix: a titled set of non-overlapping edits. */
export interface Fix {
  readonly title: string;
  readonly edits: readonly TextEdit[];
}

/**
 * One contour (an SVG subpath or basic shape, a DXF polyline or chain) in model coordinates (mm).
 * Built by the readers in formats/, read by geometry/ and checks/.
 */
export interface Contour {
  /** 0-based position in document order. */
  readonly index: number;
  /** Segments in drawing order; consecutive segments share end points. May be empty (a lone moveto). */
  readonly segments: readonly Segment[];
  /**
   * Where the segments are kept as numbers, when the reader stored them (SVG path data, DXF): `segments`
   * is then made on first read, and the engine's own loops read them in place (`getSegmentAt`).
   */
  readonly stored?: StoredSegments;
  /** True when the file closes it explicitly (SVG `Z`, closed shapes; DXF closed flag, full circles). */
  readonly closed: boolean;
  /** Start point in mm (the moveto / first vertex). */
  readonly startX: number;
  readonly startY: number;
  /** The whole contour's text: the subpath's commands in `d`, or the element for basic shapes. */
  readonly span: SourceSpan;
  /** Where the contour starts (SVG: the moveto command; shapes: the element). */
  readonly startSpan: SourceSpan;
  /** Where the contour ends (SVG: the last drawing command or the `Z`; shapes: the element). */
  readonly endSpan: SourceSpan;
  /** The element's start tag (SVG) or entity (DXF) the contour came from. */
  readonly elementSpan: SourceSpan;
  /** Element or entity name as written: `path`, `rect`, `LWPOLYLINE`, … */
  readonly element: string;
  /** The element's `id` (SVG) or handle (DXF), when it has one. */
  readonly id?: string;
  /** DXF layer name. */
  readonly layer?: string;
  /** Edits that close this contour with no sliver (open contours only; absent when no fix is possible). */
  readonly closeFix?: Fix;
}

/** Unit information of a file. */
export interface UnitsInfo {
  /** True when the file declares a physical size (SVG width/height in physical units, DXF $INSUNITS ≠ 0). */
  readonly declared: boolean;
  /** Millimetres per drawing (user) unit. */
  readonly mmPerUnit: number;
  /** The unit that was assumed when none was declared (`px`, `mm`, …), else null. */
  readonly assumed: string | null;
  /** Where the declaration is, or where it would go (SVG: the root start tag; DXF: the HEADER). */
  readonly span: SourceSpan;
}

/**
 * A problem as produced by a reader or a check, before the engine resolves its severity and
 * message text from the check's definition and the user's settings.
 */
export interface RawFinding {
  readonly checkId: string;
  readonly messageId: string;
  readonly span: SourceSpan;
  /** Values for the message template and for fixes; numbers carry their unit in the key (`gapMm`). */
  readonly data: Readonly<Record<string, string | number | boolean>>;
  /** The contour the problem belongs to, when it belongs to one. */
  readonly contour?: number;
  /** Other places that matter (the other end of a gap, the other crossing segment). */
  readonly related?: readonly RelatedPlace[];
  readonly fixes?: readonly Fix[];
}

export interface RelatedPlace {
  readonly span: SourceSpan;
  readonly message: string;
}

/** A problem ready for display. */
export interface Finding extends RawFinding {
  readonly severity: Severity;
  readonly message: string;
}

/** What a reader (formats/svg, formats/dxf) returns. */
export interface ReadResult {
  readonly format: FileFormat;
  readonly yAxis: YAxis;
  readonly units: UnitsInfo;
  readonly contours: readonly Contour[];
  /** Parse problems and other reader facts (`parse-error`, …); the rest of the file is still read. */
  readonly problems: readonly RawFinding[];
}

/** A metric that may be undefined; when it is, `reason` says why (never NaN). */
export type Measured = { readonly value: number } | { readonly value: null; readonly reason: string };

/** Figures of one contour, all in mm / mm². */
export interface ContourMetrics {
  readonly closed: boolean;
  /** Distance from the end point to the start point (0 for an explicitly closed contour). */
  readonly gapMm: number;
  /** Drawn length: what a cutter travels along this contour, including the closing segment when closed. */
  readonly lengthMm: number;
  /** Perimeter, defined for closed contours. */
  readonly perimeterMm: Measured;
  /** Signed area (see the convention at the top of this file), defined for closed contours. */
  readonly signedAreaMm2: Measured;
  /** |signed area|, defined for closed contours. */
  readonly areaMm2: Measured;
  /** Turning direction as seen on screen in the file's axes; null when the area is undefined or zero. */
  readonly orientation: 'cw' | 'ccw' | null;
  /** Isoperimetric quotient Q = 4πA/L², defined for closed contours with L > 0. */
  readonly q: Measured;
  /** Deficit L² − 4πA (mm²), defined where Q is. */
  readonly deficitMm2: Measured;
  /** Bounding box [minX, minY, maxX, maxY] of the drawn curve (exact extrema, not control points). */
  readonly bboxMm: readonly [number, number, number, number];
  readonly segmentCount: number;
}

/** A contour with its figures, before the file-wide geometry (what nesting and intersections read). */
export interface MeasuredContour {
  readonly contour: Contour;
  readonly metrics: ContourMetrics;
}

/** A point where a contour crosses or touches itself. */
export interface SelfIntersection {
  readonly xMm: number;
  readonly yMm: number;
  /** `touch`: tangency, a vertex on an edge, or a vertex met twice without the passes crossing. */
  readonly kind: 'crossing' | 'touch';
  /** The later segment in drawing order, and the other one. */
  readonly span: SourceSpan;
  readonly otherSpan: SourceSpan;
}

/** A stretch of this contour lying on top of outline (a double cut). */
export interface ContourOverlap {
  /** Index of the contour it lies on; this contour's own index when it runs back over itself. */
  readonly otherContour: number;
  /** Length cut twice (mm). */
  readonly lengthMm: number;
  /** This contour's run, and the run it lies on. */
  readonly span: SourceSpan;
  readonly otherSpan: SourceSpan;
}

/** A radius or zone width with its centre; the true value is within ±errorBoundMm of valueMm. */
export interface CircleFigure {
  readonly valueMm: number;
  readonly centreXMm: number;
  readonly centreYMm: number;
  readonly errorBoundMm: number;
}

export type MeasuredCircle = { readonly value: CircleFigure } | { readonly value: null; readonly reason: string };

/** Roundness figures of a closed contour (REFERENCES.md §1.2–1.4, §3); undefined ones carry a reason. */
export interface ContourRoundness {
  /** Largest inscribed circle ρ (even-odd inside). */
  readonly inradius: MeasuredCircle;
  /** Smallest enclosing circle R. */
  readonly circumradius: MeasuredCircle;
  /** Minimum-zone roundness (ISO 12181): radial separation of the two concentric circles; centre = theirs. */
  readonly minZone: MeasuredCircle;
  /** √D/π, what the isoperimetric deficit guarantees: R − ρ ≤ √D/π (Bonnesen). */
  readonly bonnesenBoundMm: Measured;
  /** R − ρ as measured. */
  readonly radiusGapMm: Measured;
  /** True when the contour crosses itself: Q and D from the net signed area are then meaningless. */
  readonly selfCrossing: boolean;
  /** ∬ w² dA (mm²), the area in Banchoff–Pohl's L² ≥ 4π∬w² dA; defined for self-crossing contours. */
  readonly windingSquaredAreaMm2: Measured;
}

/** Convex hull of the drawn curve. For curves the true hull is within [value, value + error]. */
export interface ContourHull {
  readonly areaMm2: number;
  readonly perimeterMm: number;
  readonly areaErrorMm2: number;
  readonly perimeterErrorMm: number;
  /** A / A_hull: 1 for a convex contour, smaller the deeper its notches. */
  readonly convexity: Measured;
}

/** What the file-wide geometry says about one contour: all the checks need (see `analyzeOutlines`). */
export interface OutlineGeometry {
  readonly selfIntersections: readonly SelfIntersection[];
  readonly overlaps: readonly ContourOverlap[];
  /** Index of the innermost closed contour containing this one, or null. */
  readonly parent: number | null;
  /** Number of closed contours containing it: even = material boundary, odd = hole (even-odd rule). */
  readonly depth: number;
}

/** A contour's roundness and hull: figures no check needs, measured after the findings (`measureShapes`). */
export interface ContourShape {
  readonly roundness: ContourRoundness;
  readonly hull: ContourHull;
}

export interface ContourGeometry extends OutlineGeometry, ContourShape {}

/** A contour as the checks see it: measured, with its file-wide geometry but not yet its shape. */
export interface OutlineContourResult extends MeasuredContour {
  readonly geometry: OutlineGeometry;
}

export interface ContourResult extends OutlineContourResult {
  readonly geometry: ContourGeometry;
}

/** File figures: one pierce per contour with something to cut; net area = Σ parts (outer − holes). */
export interface FileSummary {
  readonly contours: number;
  /** Outer boundaries (even depth, closed), each with its holes. */
  readonly parts: number;
  readonly pierces: number;
  readonly cutLengthMm: number;
  readonly netAreaMm2: number;
}

/** A part: an outer boundary (closed, even depth) with its holes (closed, one level deeper, inside it). */
export interface Part {
  /** Contour index of the outer boundary. */
  readonly outer: number;
  /** Contour indices of its holes. */
  readonly holes: readonly number[];
  /** |area of the outer boundary| − Σ |area of each hole| (mm²). */
  readonly netAreaMm2: number;
  /** Every hole turns the other way from the outer boundary (information only; null when an orientation is undefined). */
  readonly holesTurnOpposite: boolean | null;
}

/** An analysis up to its findings: every figure but the contours' roundness and hull. */
export interface OutlineAnalysis {
  readonly format: FileFormat;
  readonly yAxis: YAxis;
  readonly units: UnitsInfo;
  readonly contours: readonly OutlineContourResult[];
  readonly summary: FileSummary;
  /** The parts, in the order of their outer boundaries. */
  readonly parts: readonly Part[];
  /** All problems, sorted by position; severities resolved, `off` ones removed. */
  readonly findings: readonly Finding[];
}

/** A whole analysis: the outline analysis with every contour's roundness and hull. */
export interface AnalysisResult extends OutlineAnalysis {
  readonly contours: readonly ContourResult[];
}

/** Units a user may choose to assume for files that declare none. */
export type AssumedUnit = 'auto' | 'mm' | 'cm' | 'in' | 'pt' | 'px';

export interface AnalysisOptions {
  /** Largest end-to-start gap (mm) reported as `near-closed` rather than `open-contour`. */
  readonly nearClosedToleranceMm: number;
  /** Unit assumed when a file declares none; `auto` = CSS px for SVG, mm for DXF. */
  readonly assumedUnit: AssumedUnit;
  /** DXF layers whose entities are skipped and listed by `not-analysed` (case-insensitive, as DXF layer names are). */
  readonly ignoredLayers: readonly string[];
  /** Severity overrides per check id. */
  readonly severity: Readonly<Record<string, SeveritySetting>>;
  /** Polled between phases and inside long loops; when it returns true the analysis throws `AnalysisCancelled`. */
  readonly isCancelled?: () => boolean;
}
