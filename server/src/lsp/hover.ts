/**
 * The hover card: every figure Loopwise knows about the contour under the cursor. Undefined figures
 * show why they are undefined ("— (open contour)"), never NaN.
 */
import { MarkupKind } from 'vscode-languageserver';
import type { Hover } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { formatNumber, getContourAt } from '../engine/index';
import type { AnalysisFigures, ContourGeometry, ContourHull, ContourMetrics, ContourOutline, Measured, MeasuredCircle, UnitsInfo } from '../engine/index';
import { toRange } from './diagnostics';

/** What a card is made from: a contour's figures (with or without its segments). */
export interface CardSource {
  readonly contour: Omit<ContourOutline, 'segmentSpans'>;
  readonly metrics: ContourMetrics;
  readonly geometry: ContourGeometry;
}

/** One line of the card: a label and its value, both plain text. */
export interface CardRow {
  readonly label: string;
  readonly value: string;
}

export interface ContourCard {
  readonly title: string;
  readonly subtitle: string;
  readonly rows: readonly CardRow[];
}

function undefinedBecause(reason: string): string {
  return `— (${reason})`;
}

function measured(m: Measured, unit: string): string {
  if (m.value === null) return undefinedBecause(m.reason);
  return unit ? `${formatNumber(m.value)} ${unit}` : formatNumber(m.value);
}

/**
 * Lengths below a nanometre are floating-point residue, not geometry (no cutting machine holds
 * 1e-9 mm): such a value reads as 0 and such an error bound is not shown.
 */
const RESIDUE_MM = 1e-9;

/** A length in mm for the card: residue reads as 0. */
function length(v: number): string {
  return Math.abs(v) < RESIDUE_MM ? '0' : formatNumber(v);
}

/** " ± b" when the bound is more than residue, else nothing. */
function plusMinus(errorBoundMm: number): string {
  return errorBoundMm < RESIDUE_MM ? '' : ` ± ${formatNumber(errorBoundMm)}`;
}

/** A radius or zone with its centre; the error bound is shown when it is more than residue. */
function circle(m: MeasuredCircle): string {
  if (m.value === null) return undefinedBecause(m.reason);
  const { valueMm, centreXMm, centreYMm, errorBoundMm } = m.value;
  return `${length(valueMm)}${plusMinus(errorBoundMm)} mm, centre (${length(centreXMm)}, ${length(centreYMm)})`;
}

/**
 * The deficit L² − 4πA: within the rounding of its two terms (16 ulp of L²) it is 0, as for a circle
 * drawn with exact arcs, rather than a stray 1e-14.
 */
function deficit(metrics: ContourMetrics): string {
  const d = metrics.deficitMm2;
  if (d.value === null) return undefinedBecause(d.reason);
  const rounding = 16 * Number.EPSILON * metrics.lengthMm * metrics.lengthMm;
  return Math.abs(d.value) <= rounding ? '0 mm² (to rounding)' : `${formatNumber(d.value)} mm²`;
}

/** Where the contour lies; for a hole, whether it turns opposite its outline (information only); for
 *  the outer boundary of a part with holes, their number and the part's net area. */
function describeNesting(entry: CardSource, result: AnalysisFigures): string {
  const { geometry: g, metrics } = entry;
  const holes = () => {
    const part = result.parts.find((p) => p.outer === entry.contour.index);
    if (!part || part.holes.length === 0) return '';
    return `, ${part.holes.length === 1 ? '1 hole' : `${part.holes.length} holes`}, part net area ${formatNumber(part.netAreaMm2)} mm²`;
  };
  if (g.parent === null) return metrics.closed ? `outer boundary${holes()}` : 'not inside any closed contour';
  if (!metrics.closed) return `inside contour #${g.parent}`;
  if (g.depth % 2 === 0) return `island inside contour #${g.parent}${holes()}`;
  const outer = result.contours.find((c) => c.contour.index === g.parent)?.metrics.orientation ?? null;
  const turn = metrics.orientation === null || outer === null ? ''
    : metrics.orientation === outer ? `, turning the same way (${outer})` : `, turning the other way (${metrics.orientation} in ${outer})`;
  return `hole in contour #${g.parent}${turn}`;
}

/**
 * The hull's area and perimeter. A hull taken from the flattened curve may fall short of the true one
 * (never above it): the most it may is shown when it is more than residue.
 */
function hull(h: ContourHull): string {
  const more = (bound: number, unit: string) => (bound < RESIDUE_MM ? '' : ` (up to ${formatNumber(bound)} ${unit} more)`);
  return `area ${formatNumber(h.areaMm2)} mm²${more(h.areaErrorMm2, 'mm²')}, perimeter ${formatNumber(h.perimeterMm)} mm${more(h.perimeterErrorMm, 'mm')}`;
}

/** Rows for the file-wide geometry: roundness (REFERENCES.md §1.2–1.4, §3), hull, nesting, self-crossing. */
function geometryRows(entry: CardSource, result: AnalysisFigures): CardRow[] {
  const { geometry: g } = entry;
  const r = g.roundness;
  const f = (v: number) => formatNumber(v);
  // R − ρ carries both radii's error bounds; the Bonnesen bound is exact up to the deficit's rounding.
  const gapError = (r.inradius.value?.errorBoundMm ?? 0) + (r.circumradius.value?.errorBoundMm ?? 0);
  const gapBound = plusMinus(gapError);
  const gap = r.radiusGapMm.value === null ? undefinedBecause(r.radiusGapMm.reason)
    : r.bonnesenBoundMm.value === null ? `${length(r.radiusGapMm.value)}${gapBound} mm measured (Bonnesen bound ${undefinedBecause(r.bonnesenBoundMm.reason)})`
    : `${length(r.radiusGapMm.value)}${gapBound} mm measured; Bonnesen bound √D/π = ${length(r.bonnesenBoundMm.value)} mm`;
  const rows: CardRow[] = [
    { label: 'Inradius ρ', value: circle(r.inradius) },
    { label: 'Circumradius R', value: circle(r.circumradius) },
    { label: 'Minimum zone (ISO 12181)', value: circle(r.minZone) },
    { label: 'R − ρ', value: gap },
    { label: 'Convex hull', value: hull(g.hull) },
    { label: 'Convexity A/A_hull', value: measured(g.hull.convexity, '') },
    { label: 'Nesting', value: describeNesting(entry, result) },
  ];
  if (r.selfCrossing) {
    const crossings = g.selfIntersections.filter((x) => x.kind === 'crossing').length;
    const w2 = r.windingSquaredAreaMm2.value === null ? undefinedBecause(r.windingSquaredAreaMm2.reason) : `${f(r.windingSquaredAreaMm2.value)} mm²`;
    rows.push({
      label: 'Self-crossing',
      value: `crosses itself ${crossings === 1 ? 'once' : `${crossings} times`}: Q and the deficit from the net area mean nothing here; Banchoff–Pohl L² ≥ 4π∬w² dA with ∬w² dA = ${w2}`,
    });
  }
  if (g.overlaps.length > 0) {
    const total = g.overlaps.reduce((s, o) => s + o.lengthMm, 0);
    rows.push({ label: 'Double cut', value: `${f(total)} mm cut twice` });
  }
  return rows;
}

function describeUnits(units: UnitsInfo): string {
  if (units.declared) return `declared (1 unit = ${formatNumber(units.mmPerUnit, 6)} mm)`;
  return `assumed: ${units.assumed ?? `1 unit = ${formatNumber(units.mmPerUnit, 6)} mm`} — set loopwise.assumedUnit`;
}

/** The card's content as plain data; `getHover` renders it for the client. */
export function getContourCard(entry: CardSource, result: AnalysisFigures): ContourCard {
  const { contour, metrics } = entry;
  const gap = `gap ${formatNumber(metrics.gapMm)} mm`;
  const status = metrics.closed ? (metrics.gapMm > 0 ? `closed (${gap})` : 'closed') : `open, ${gap}`;
  let orientation: string;
  if (metrics.orientation !== null) orientation = `${metrics.orientation} (as displayed)`;
  else if (!metrics.closed) orientation = undefinedBecause('open contour');
  else if (metrics.signedAreaMm2.value === null) orientation = undefinedBecause(metrics.signedAreaMm2.reason);
  else orientation = undefinedBecause('zero area');
  const [minX, minY, maxX, maxY] = metrics.bboxMm;
  const f = (v: number) => formatNumber(v);
  const bbox = `x ${f(minX)} … ${f(maxX)}, y ${f(minY)} … ${f(maxY)} mm (${f(maxX - minX)} × ${f(maxY - minY)} mm)`;

  const where = [contour.element, contour.id !== undefined ? `#${contour.id}` : '', contour.layer !== undefined ? `layer ${contour.layer}` : '']
    .filter((s) => s !== '')
    .join(' ');
  return {
    title: `Contour #${contour.index} (of ${result.contours.length})`,
    subtitle: where,
    rows: [
      { label: 'Status', value: status },
      { label: 'Segments', value: String(metrics.segmentCount) },
      { label: 'Orientation', value: orientation },
      { label: 'Drawn length', value: `${f(metrics.lengthMm)} mm` },
      { label: 'Perimeter', value: measured(metrics.perimeterMm, 'mm') },
      { label: 'Area', value: measured(metrics.areaMm2, 'mm²') },
      { label: 'Roundness Q = 4πA/L²', value: measured(metrics.q, '') },
      { label: 'Deficit L² − 4πA', value: deficit(metrics) },
      ...geometryRows(entry, result),
      { label: 'Bounding box', value: bbox },
      { label: 'Units', value: describeUnits(result.units) },
    ],
  };
}

/**
 * Backslash-escapes the characters that could start markup inside a table cell (emphasis, code,
 * links, cell borders, HTML, entities), so ids from the file show literally.
 */
export function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_[\]|<>~&#!]/g, '\\$&');
}

export function renderCardMarkdown(card: ContourCard): string {
  const header = `| **${escapeMarkdown(card.title)}** | ${escapeMarkdown(card.subtitle)} |`;
  const rows = card.rows.map((r) => `| ${escapeMarkdown(r.label)} | ${escapeMarkdown(r.value)} |`);
  return [header, '| :-- | :-- |', ...rows].join('\n');
}

export function renderCardPlaintext(card: ContourCard): string {
  const head = card.subtitle ? `${card.title} — ${card.subtitle}` : card.title;
  return [head, ...card.rows.map((r) => `${r.label}: ${r.value}`)].join('\n');
}

/** The hover for `offset`, spanning the contour's text; null when no contour is there. */
export function getHover(
  result: AnalysisFigures,
  document: TextDocument,
  offset: number,
  kind: MarkupKind,
): Hover | null {
  const entry = getContourAt(result, offset);
  if (!entry) return null;
  const card = getContourCard(entry, result);
  return {
    contents: {
      kind,
      value: kind === MarkupKind.Markdown ? renderCardMarkdown(card) : renderCardPlaintext(card),
    },
    range: toRange(document, entry.contour.span),
  };
}
