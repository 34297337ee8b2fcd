import type { FileGeometry } from '../geometry/fileGeometry';
import type { AnalysisOptions, OutlineContourResult, RawFinding, ReadResult, Severity } from '../types';

/** What a check sees: the read model, each contour with its figures (not its roundness and hull, which
 *  come after the findings), the file's geometry (computed once per analysis, shared by all checks)
 *  and a way to report. */
export interface CheckContext {
  readonly read: ReadResult;
  readonly contours: readonly OutlineContourResult[];
  readonly geometry: FileGeometry;
  /** Per contour (by position): the length of its shortest segment, as measured (see DetailedContourMetrics). */
  readonly shortestSegmentMm: Float64Array;
  readonly options: AnalysisOptions;
  report(finding: Omit<RawFinding, 'checkId'>): void;
}

/** A check: one kind of problem, with its public id, default severity and keyed message templates. */
export interface CheckDefinition {
  /** Public id: diagnostic code, settings key, CLI filter and docs anchor. */
  readonly id: string;
  readonly description: string;
  readonly defaultSeverity: Severity;
  /** Message templates by message id; `{name}` is replaced by the finding's data (numbers formatted). */
  readonly messages: Readonly<Record<string, string>>;
  /** Produces findings. Checks whose problems come from a reader (`parse-error`) have no `run`. */
  readonly run?: (ctx: CheckContext) => void;
}

export function defineCheck<const T extends CheckDefinition>(check: T): T {
  return check;
}
