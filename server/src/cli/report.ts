/**
 * Renders analysis results for the terminal (a table per file plus `file:line:column` problem lines)
 * and as the machine-readable JSON report — a public contract documented in the README
 * ("The JSON report"). Pure: strings out, no I/O.
 */
import { formatNumber, getPlacement } from '../engine/index';
import type { AnalysisResult, ContourResult, FileSummary, Finding, Measured, MeasuredCircle, Severity } from '../engine/index';
import { createLineIndex, type LineIndex } from '../engine/lineIndex';

export type FileReport =
  | { readonly path: string; readonly text: string; readonly result: AnalysisResult }
  | { readonly path: string; readonly error: string };

const valueOf = (m: Measured): number | null => m.value;
const radiusOf = (m: MeasuredCircle): number | null => m.value?.valueMm ?? null;
const centreOf = (m: MeasuredCircle): [number, number] | null => (m.value ? [m.value.centreXMm, m.value.centreYMm] : null);

function toJsonContour(c: ContourResult, lines: LineIndex) {
  const { contour, metrics, geometry } = c;
  const r = geometry.roundness;
  const start = lines.at(contour.span.start);
  const end = lines.at(contour.span.end);
  return {
    index: contour.index,
    source: {
      line: start.line,
      column: start.column,
      endLine: end.line,
      endColumn: end.column,
      element: contour.element,
      id: contour.id ?? null,
      ...(contour.layer !== undefined ? { layer: contour.layer } : {}),
    },
    closed: metrics.closed,
    gapMm: metrics.gapMm,
    lengthMm: metrics.lengthMm,
    perimeterMm: valueOf(metrics.perimeterMm),
    areaMm2: valueOf(metrics.areaMm2),
    signedAreaMm2: valueOf(metrics.signedAreaMm2),
    orientation: metrics.orientation,
    q: valueOf(metrics.q),
    deficitMm2: valueOf(metrics.deficitMm2),
    bboxMm: metrics.bboxMm,
    segments: metrics.segmentCount,
    selfIntersections: geometry.selfIntersections.map((x) => ({ xMm: x.xMm, yMm: x.yMm, kind: x.kind })),
    overlaps: geometry.overlaps.map((o) => ({ otherContour: o.otherContour, lengthMm: o.lengthMm })),
    parent: geometry.parent,
    roundness: {
      inradiusMm: radiusOf(r.inradius),
      circumradiusMm: radiusOf(r.circumradius),
      minZoneMm: radiusOf(r.minZone),
      bonnesenBoundMm: valueOf(r.bonnesenBoundMm),
      radiusGapMm: valueOf(r.radiusGapMm),
      inCentreMm: centreOf(r.inradius),
      circumCentreMm: centreOf(r.circumradius),
      minZoneCentreMm: centreOf(r.minZone),
      selfCrossing: r.selfCrossing,
      windingSquaredAreaMm2: valueOf(r.windingSquaredAreaMm2),
    },
    hull: { areaMm2: geometry.hull.areaMm2, perimeterMm: geometry.hull.perimeterMm, convexity: valueOf(geometry.hull.convexity) },
  };
}

function toJsonProblem(f: Finding, lines: LineIndex) {
  const start = lines.at(f.span.start);
  const end = lines.at(f.span.end);
  return {
    id: f.checkId,
    severity: f.severity,
    message: f.message,
    line: start.line,
    column: start.column,
    endLine: end.line,
    endColumn: end.column,
    ...(f.contour !== undefined ? { contour: f.contour } : {}),
  };
}

/** The JSON report: `{ "files": [...] }`, see the README for every field. */
export function renderJson(files: readonly FileReport[]): string {
  const out = files.map((file) => {
    if ('error' in file) return { path: file.path, error: file.error };
    const { result } = file;
    const lines = createLineIndex(file.text);
    return {
      path: file.path,
      format: result.format,
      units: { declared: result.units.declared, mmPerUnit: result.units.mmPerUnit, assumed: result.units.assumed },
      contours: result.contours.map((c) => toJsonContour(c, lines)),
      summary: result.summary,
      parts: result.parts,
      problems: result.findings.map((f) => toJsonProblem(f, lines)),
    };
  });
  return JSON.stringify({ files: out }, null, 2) + '\n';
}

const dash = '—';
const show = (m: Measured, digits = 3): string => (m.value === null ? dash : formatNumber(m.value, digits));

function table(rows: readonly (readonly string[])[], rightAligned: ReadonlySet<number>): string[] {
  const widths = rows[0]!.map((_, col) => Math.max(...rows.map((r) => r[col]!.length)));
  return rows.map((r) =>
    r.map((cell, col) => (rightAligned.has(col) ? cell.padStart(widths[col]!) : cell.padEnd(widths[col]!))).join('  ').trimEnd(),
  );
}

/** "1 part", "2 parts". */
function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function describeSummary(s: FileSummary): string {
  return `${plural(s.contours, 'contour')}, ${plural(s.parts, 'part')}, ${plural(s.pierces, 'pierce')}, ` +
    `cut length ${formatNumber(s.cutLengthMm)} mm, net area ${formatNumber(s.netAreaMm2)} mm²`;
}

/** To the µm, so flattening residues (a circle's R − ρ of 5e-5 mm) do not crowd the table. */
const toMicron = (v: number): string => formatNumber(Math.round(v * 1000) / 1000);
const radius = (m: MeasuredCircle): string => (m.value === null ? dash : toMicron(m.value.valueMm));
const micron = (m: Measured): string => (m.value === null ? dash : toMicron(m.value));

/** Roundness of the closed contours: ρ, R, minimum zone, R − ρ measured beside Bonnesen's √D/π. */
function roundnessTable(contours: readonly ContourResult[]): string[] {
  const closed = contours.filter((c) => c.metrics.closed);
  if (closed.length === 0) return [];
  const rows: string[][] = [['#', 'ρ mm', 'R mm', 'zone mm', 'R−ρ mm', '√D/π mm', 'convexity', 'inside', 'note']];
  for (const { contour, geometry: g } of closed) {
    const r = g.roundness;
    rows.push([
      String(contour.index),
      radius(r.inradius),
      radius(r.circumradius),
      radius(r.minZone),
      micron(r.radiusGapMm),
      micron(r.bonnesenBoundMm),
      show(g.hull.convexity),
      g.parent === null ? dash : `#${g.parent}`,
      r.selfCrossing
        ? `crosses itself: Q, D meaningless; ∬w² dA ${r.windingSquaredAreaMm2.value === null ? dash : `${formatNumber(r.windingSquaredAreaMm2.value)} mm²`}`
        : '',
    ]);
  }
  return table(rows, new Set([0, 1, 2, 3, 4, 5, 6]));
}

function describeUnits(result: AnalysisResult): string {
  const { units } = result;
  const scale = `1 unit = ${formatNumber(units.mmPerUnit, 6)} mm`;
  return units.declared ? scale : `${scale}, assumed ${units.assumed ?? ''}`.trimEnd();
}

/** The terminal report: per file a contour table and the problems as `file:line:column`. */
export function renderText(files: readonly FileReport[]): string {
  const out: string[] = [];
  const counts: Record<Severity, number> = { error: 0, warning: 0, info: 0 };
  let contourCount = 0;
  for (const file of files) {
    if ('error' in file) {
      out.push(`${file.path}: cannot be read: ${file.error}`, '');
      continue;
    }
    const { result } = file;
    const lines = createLineIndex(file.text);
    out.push(`${file.path}  (${result.format.toUpperCase()}, ${describeUnits(result)})`);
    const problemsByContour = new Map<number, Set<string>>();
    for (const f of result.findings) {
      if (f.contour === undefined) continue;
      const set = problemsByContour.get(f.contour) ?? new Set<string>();
      set.add(f.checkId);
      problemsByContour.set(f.contour, set);
    }
    if (result.contours.length === 0) {
      out.push('  no contours');
    } else {
      const rows: string[][] = [['#', 'element', 'at', 'closed', 'gap mm', 'length mm', 'perimeter mm', 'area mm²', 'Q', 'problems']];
      for (const { contour, metrics } of result.contours) {
        const at = lines.at(getPlacement(contour).start);
        rows.push([
          String(contour.index),
          contour.id ? `${contour.element}#${contour.id}` : contour.element,
          `${at.line}:${at.column}`,
          metrics.closed ? 'yes' : 'no',
          formatNumber(metrics.gapMm, 4),
          formatNumber(metrics.lengthMm),
          show(metrics.perimeterMm),
          show(metrics.areaMm2),
          show(metrics.q, 4),
          [...(problemsByContour.get(contour.index) ?? [])].join(', '),
        ]);
      }
      out.push(...table(rows, new Set([0, 4, 5, 6, 7, 8])).map((l) => `  ${l}`));
      const roundness = roundnessTable(result.contours);
      if (roundness.length > 0) out.push('  roundness', ...roundness.map((l) => `  ${l}`));
    }
    out.push(`  ${describeSummary(result.summary)}`);
    contourCount += result.contours.length;
    for (const f of result.findings) {
      counts[f.severity]++;
      const at = lines.at(f.span.start);
      out.push(`${file.path}:${at.line}:${at.column}  ${f.severity}  ${f.checkId}  ${f.message}`);
    }
    out.push('');
  }
  out.push(
    `${plural(files.length, 'file')}, ${plural(contourCount, 'contour')}: ${plural(counts.error, 'error')}, ${plural(counts.warning, 'warning')}, ${plural(counts.info, 'note')}`,
  );
  return out.join('\n') + '\n';
}
