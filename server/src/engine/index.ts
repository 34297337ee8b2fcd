/**
 * The engine facade: text and options in, plain results out. No editor, protocol, file-system or
 * process imports anywhere under engine/ — the language server and the CLI are thin adapters.
 */
import { checks, getCheck } from './checks/index';
import { fillTemplate } from './format';
import { readDxf } from './formats/dxf/readDxf';
import { readSvg } from './formats/svg/readSvg';
import { getFileGeometry } from './geometry/fileGeometry';
import { measureContour } from './geometry/measure';
import { DEFAULT_NEAR_CLOSED_TOLERANCE_MM } from './geometry/tolerances';
import type {
  AnalysisOptions,
  AnalysisResult,
  ContourResult,
  FileFormat,
  Finding,
  MeasuredContour,
  RawFinding,
  ReadResult,
} from './types';

export type * from './types';
export { checks, getCheck } from './checks/index';
export { formatNumber } from './format';
export { getContourAt, getPlacement, toFigures } from './figures';
export type { AnalysisFigures, ContourFigures, ContourOutline } from './figures';

export const DEFAULT_OPTIONS: AnalysisOptions = {
  nearClosedToleranceMm: DEFAULT_NEAR_CLOSED_TOLERANCE_MM,
  assumedUnit: 'auto',
  ignoredLayers: [],
  severity: {},
};

/** Thrown by `analyze` when `options.isCancelled()` returns true. */
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

/** Analyses one file's text. Throws `AnalysisCancelled` when cancelled; never throws on bad input. */
export function analyze(text: string, format: FileFormat, partial: Partial<AnalysisOptions> = {}): AnalysisResult {
  const options: AnalysisOptions = { ...DEFAULT_OPTIONS, ...partial };
  const checkCancelled = () => {
    if (options.isCancelled?.()) throw new AnalysisCancelled();
  };
  const readResult = read(text, format, options);
  checkCancelled();
  const measured: MeasuredContour[] = readResult.contours.map((contour) => ({
    contour,
    metrics: measureContour(contour, readResult.yAxis),
  }));
  checkCancelled();
  const geometry = getFileGeometry(measured, checkCancelled, options.isCancelled);
  const contours: ContourResult[] = measured.map((c, i) => ({ ...c, geometry: geometry.contours[i]! }));

  const raw: RawFinding[] = [...readResult.problems];
  for (const check of checks) {
    if (!check.run || options.severity[check.id] === 'off') continue;
    check.run({
      read: readResult,
      contours,
      geometry,
      options,
      report: (f) => raw.push({ ...f, checkId: check.id }),
    });
    checkCancelled();
  }

  const findings: Finding[] = [];
  for (const f of raw) {
    const check = getCheck(f.checkId);
    const setting = options.severity[f.checkId] ?? check.defaultSeverity;
    if (setting === 'off') continue;
    const template = check.messages[f.messageId] ?? f.messageId;
    findings.push({ ...f, severity: setting, message: fillTemplate(template, f.data) });
  }
  findings.sort((a, b) => a.span.start - b.span.start || a.span.end - b.span.end);

  return { format, yAxis: readResult.yAxis, units: readResult.units, contours, summary: geometry.summary, findings };
}

