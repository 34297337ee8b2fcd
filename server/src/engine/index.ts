/**
 * The engine facade: text and options in, plain results out. No editor, protocol, file-system or
 * process imports anywhere under engine/ — the language server and the CLI are thin adapters.
 */
import { checks, getCheck } from './checks/index';
import { fillTemplate } from './format';
import { readDxf } from './formats/dxf/readDxf';
import { readSvg } from './formats/svg/readSvg';
import { getFileGeometry } from './geometry/fileGeometry';
import { measureContourDetailed } from './geometry/measure';
import { measureContourShapes, withContourShapes } from './geometry/shapes';
import { DEFAULT_NEAR_CLOSED_TOLERANCE_MM } from './geometry/tolerances';
import type {
  AnalysisOptions,
  AnalysisResult,
  ContourShape,
  FileFormat,
  Finding,
  MeasuredContour,
  OutlineAnalysis,
  OutlineContourResult,
  OutlineGeometry,
  ReadResult,
} from './types';

export type * from './types';
export { checks, getCheck } from './checks/index';
export { formatNumber } from './format';
export { getContourAt, getPlacement, toFigures, withShapes } from './figures';
export type { AnalysisFigures, ContourFigures, ContourOutline, OutlineContourFigures, OutlineFigures } from './figures';

export const DEFAULT_OPTIONS: AnalysisOptions = {
  nearClosedToleranceMm: DEFAULT_NEAR_CLOSED_TOLERANCE_MM,
  assumedUnit: 'auto',
  ignoredLayers: [],
  severity: {},
};

/** A contour's result while it is built: its geometry is set once the file's geometry is known. */
interface ContourSlot extends MeasuredContour {
  geometry: OutlineGeometry | null;
}

/** Thrown by the analysis when `options.isCancelled()` returns true. */
export class AnalysisCancelled extends Error {
  constructor() {
    super('Analysis cancelled');
    this.name = 'AnalysisCancelled';
  }
}

/** Picks the reader for a file name, or undefined when Loopwise does not read that kind of file. */
export function getFormatForPath(path: string): FileFormat | undefined {
  const lower = path.toLowerCase();
  if (lower.endsWith('.svg')) return 'svg';
  if (lower.endsWith('.dxf')) return 'dxf';
  return undefined;
}

function read(text: string, format: FileFormat, options: AnalysisOptions): ReadResult {
  switch (format) {
    case 'svg':
      return readSvg(text, { assumedUnit: options.assumedUnit });
    case 'dxf':
      return readDxf(text, {
        assumedUnit: options.assumedUnit,
        ignoredLayers: options.ignoredLayers,
        nearClosedToleranceMm: options.nearClosedToleranceMm,
      });
  }
}

/**
 * Sorts findings by span start, then end; equal spans keep their order. The keys are copied out
 * first: comparing through each finding's span object chases two pointers per comparison, which
 * took ~2 s for 250 000 findings spread over a large heap.
 */
function sortBySpan(findings: Finding[]): void {
  const n = findings.length;
  const starts = new Float64Array(n), ends = new Float64Array(n);
  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    const { span } = findings[i]!;
    starts[i] = span.start;
    ends[i] = span.end;
    order[i] = i;
  }
  order.sort((i, j) => starts[i]! - starts[j]! || ends[i]! - ends[j]! || i - j);
  const byPosition = findings.slice();
  for (let k = 0; k < n; k++) findings[k] = byPosition[order[k]!]!;
}

/** A check to call between stages: it throws `AnalysisCancelled` once `isCancelled()` returns true. */
function cancelCheck(isCancelled: (() => boolean) | undefined): () => void {
  return () => {
    if (isCancelled?.()) throw new AnalysisCancelled();
  };
}

/** Analyses one file's text, every figure included. Throws `AnalysisCancelled` when cancelled; never throws on bad input. */
export function analyze(text: string, format: FileFormat, partial: Partial<AnalysisOptions> = {}): AnalysisResult {
  const outlines = analyzeOutlines(text, format, partial);
  return { ...outlines, contours: withContourShapes(outlines.contours, measureShapes(outlines, partial.isCancelled)) };
}

/**
 * Analyses one file's text up to its findings: everything but the contours' roundness and hull
 * (`measureShapes`), so an editor can show the problems first. Throws `AnalysisCancelled` when
 * cancelled; never throws on bad input.
 */
export function analyzeOutlines(text: string, format: FileFormat, partial: Partial<AnalysisOptions> = {}): OutlineAnalysis {
  const options: AnalysisOptions = { ...DEFAULT_OPTIONS, ...partial };
  const checkCancelled = cancelCheck(options.isCancelled);
  const readResult = read(text, format, options);
  checkCancelled();
  // Each contour's result object is made once: measured here, its geometry set below (a spread into
  // a second object per contour cost ~0.5 s and 10 MB at 250 000 contours).
  const slots: ContourSlot[] = new Array(readResult.contours.length);
  const shortestSegmentMm = new Float64Array(slots.length);
  for (let i = 0; i < slots.length; i++) {
    const contour = readResult.contours[i]!;
    const measured = measureContourDetailed(contour, readResult.yAxis);
    slots[i] = { contour, metrics: measured.metrics, geometry: null };
    shortestSegmentMm[i] = measured.shortestSegmentMm;
  }
  checkCancelled();
  const geometry = getFileGeometry(slots, checkCancelled, options.isCancelled);
  for (let i = 0; i < slots.length; i++) slots[i]!.geometry = geometry.contours[i]!;
  const contours = slots as readonly ContourSlot[] as readonly OutlineContourResult[];
  // Findings are resolved as they are reported, each copied once with its check id, severity and
  // message. Not by `{ ...f, checkId }`: in V8 a spread followed by more properties gives every object
  // a hidden class of its own (~300 B and several µs a finding).
  const findings: Finding[] = [];
  for (const f of readResult.problems) {
    const check = getCheck(f.checkId);
    const setting = options.severity[f.checkId] ?? check.defaultSeverity;
    if (setting === 'off') continue;
    findings.push(Object.assign({}, f, { severity: setting, message: fillTemplate(check.messages[f.messageId] ?? f.messageId, f.data) }));
  }
  for (const check of checks) {
    const setting = options.severity[check.id] ?? check.defaultSeverity;
    if (!check.run || setting === 'off') continue;
    const { id: checkId, messages } = check;
    check.run({
      read: readResult,
      contours,
      geometry,
      shortestSegmentMm,
      options,
      report: (f) => findings.push(Object.assign({}, f, { checkId, severity: setting, message: fillTemplate(messages[f.messageId] ?? f.messageId, f.data) })),
    });
    checkCancelled();
  }
  sortBySpan(findings);
  return { format, yAxis: readResult.yAxis, units: readResult.units, contours, summary: geometry.summary, parts: geometry.nesting.parts, findings };
}

/**
 * The roundness and hull of each contour of an outline analysis, by position (join them with
 * `withShapes` or as `analyze` does). Throws `AnalysisCancelled` when `isCancelled()` turns true.
 */
export function measureShapes(analysis: OutlineAnalysis, isCancelled?: () => boolean): ContourShape[] {
  return measureContourShapes(analysis.contours, cancelCheck(isCancelled));
}

