/**
 * The DXF reader: ASCII DXF text → contours in WCS millimetres (y up), units, and reader problems.
 *
 * Steps: binary sentinel test (§6.6) → group scan and entity records (groups.ts, entities.ts), each
 * top-level entity passed on as soon as it is read (a LINE, ARC or CIRCLE as numbers, no record) →
 * units from $INSUNITS (units.ts) → exact duplicates
 * set aside → entities on hidden or ignored layers skipped, the rest to pieces through OCS and block
 * inserts (pieces.ts; flat records in pieceStore.ts) → loose open pieces chained end to end per layer
 * (model/chain.ts) → contours, whose `Segment` objects are made only now, with the close fixes that
 * edit only the value lines they must.
 */
import { fillTemplate, formatNumber } from '../../format';
import { CHAIN_TOLERANCE_MM } from '../../geometry/tolerances';
import { chainPieces, getChainCount } from '../../model/chain';
import { SegmentView, withStoredSegments } from '../../model/packedSegment';
import type { AssumedUnit, Contour, Fix, RawFinding, ReadResult, SourceSpan, TextEdit, UnitsInfo } from '../../types';
import { findPointRef, parseDxfDocument, releaseDxfDocument, type DocumentSoFar, type DxfEntity, type EntitySink, type PointGroups, type PointRef, type SimpleEntity } from './entities';
import { GroupScanner, isBinaryDxf } from './groups';
import { PieceBuilder } from './pieces';
import type { PieceStore, PolylineFixInfo } from './pieceStore';
import { getDxfUnits } from './units';
import { getVectorLength } from '../../geometry/length';
import { keepShape } from '../../keepShape';

export interface ReadDxfOptions {
  readonly assumedUnit: AssumedUnit;
  /** Layers whose entities are skipped and listed (names compared case-insensitively, as DXF does). */
  readonly ignoredLayers?: readonly string[];
  /**
   * Close fixes are built only for contours whose ends are at most this far apart (mm): farther
   * ends are an open contour, which no fix closes. Default: every open contour gets its fix.
   */
  readonly nearClosedToleranceMm?: number;
}

/** Related places listed per finding at most (the count is in the message). */
const MAX_RELATED = 20;

/** Reads an ASCII DXF text. Never throws: malformed input becomes problems and the rest is read. */
export function readDxf(text: string, options: ReadDxfOptions): ReadResult {
  const problems: RawFinding[] = [];
  if (isBinaryDxf(text)) {
    problems.push({
      checkId: 'parse-error', messageId: 'dxf', span: { start: 0, end: Math.min(text.length, 22) },
      data: { detail: 'this is a binary DXF file; only ASCII DXF is read (save it as ASCII DXF)' },
    });
    return { format: 'dxf', yAxis: 'up', units: getDxfUnits(undefined, undefined, options.assumedUnit, problems), contours: [], problems };
  }
  // Entities stream from the scanner into pieces, so their records die young. A file whose HEADER,
  // TABLES or BLOCKS section follows its ENTITIES section is read again, collected, once all is known.
  let reader = new EntityReader(text, options);
  const doc = parseDxfDocument(text, reader);
  if (doc.lateSections) {
    reader = new EntityReader(text, options);
    const again = parseDxfDocument(text);
    for (const e of again.entities) reader.entity(e, doc);
    releaseDxfDocument(again);
  }
  const { builder, units } = reader.finish(doc);
  problems.push(...doc.problems, ...reader.problems);
  reportNotes(builder, doc.layers, problems);
  const contours = buildContours(text, builder.store, units, doc.eol, options.nearClosedToleranceMm ?? Infinity, problems);
  // The reader and the document builder are kept for their layouts (keepShape.ts): drop their data.
  reader.release();
  releaseDxfDocument(doc);
  return { format: 'dxf', yAxis: 'up', units, contours, problems };
}

/**
 * Turns top-level entities, one at a time, into pieces, setting exact duplicates aside. Of an entity
 * it keeps only its span, line and hash (for duplicates), not the record.
 */
class EntityReader implements EntitySink {
  /** Units and duplicate problems, in the order they arise. */
  readonly problems: RawFinding[] = [];
  private builder?: PieceBuilder;
  private units?: UnitsInfo;
  private order = 0;
  /** Kept entities: span start, span end, 0-based line and the previous kept one with the same hash (−1 for none). */
  private kept: Int32Array = new Int32Array(4 * 1024);
  private keptCount = 0;
  /**
   * Open-addressing table of hashes: slot → (hash, last kept entity with that hash + 1), 0 for an empty
   * slot; the hash sits beside its entity, so a probe reads one cache line. Doubles when half full.
   */
  private table = new Int32Array(2 * 1024);

  constructor(private readonly text: string, private readonly options: ReadDxfOptions) {
    keepShape(this);
  }

  /** Drops this read's data (kept entities, duplicate table, problems, pieces); see keepShape.ts. */
  release(): void {
    this.kept = new Int32Array(0);
    this.keptCount = 0;
    this.table = new Int32Array(0);
    this.problems.length = 0;
    this.builder?.release();
  }

  private start(known: DocumentSoFar): PieceBuilder {
    this.units = getDxfUnits(known.insunits, known.headerSpan, this.options.assumedUnit, this.problems);
    this.builder = new PieceBuilder(known.blocks, known.layers, this.units.mmPerUnit, this.options.ignoredLayers);
    return this.builder;
  }

  entity(e: DxfEntity, known: DocumentSoFar): void {
    const builder = this.builder ?? this.start(known);
    const order = this.order++;
    if (e.kind !== 'other' && !e.paperSpace && this.isDuplicate(e.type, e.hash, e.span.start, e.span.end, e.line)) return;
    builder.addTopLevel(e, order);
  }

  simple(e: SimpleEntity, known: DocumentSoFar): void {
    const builder = this.builder ?? this.start(known);
    const order = this.order++;
    if (!e.paperSpace && this.isDuplicate(e.type, e.hash, e.start, e.end, e.line)) return;
    builder.addSimple(e, order);
  }

  /**
   * True (and reported) when the entity at [start, end) repeats a kept one exactly; otherwise it is
   * kept. `line` is its 0-based line.
   */
  private isDuplicate(type: string, hash: number, start: number, end: number, line: number): boolean {
    const slot = this.findSlot(hash | 0);
    const last = this.table[slot + 1] - 1;
    const first = last < 0 ? -1 : this.findDuplicate(last, start, end);
    if (first >= 0) {
      const k = this.kept;
      const span = { start, end };
      this.problems.push({
        checkId: 'duplicate-entity', messageId: 'duplicate', span,
        data: { entity: type, line: k[4 * first + 2] + 1 },
        related: [{ span: { start: k[4 * first], end: k[4 * first + 1] }, message: `The first ${type}` }],
        fixes: [{ title: `Remove the duplicate ${type}`, edits: [{ span, newText: '' }] }],
      });
      return true;
    }
    const i = this.keptCount++;
    if (4 * i + 4 > this.kept.length) {
      const grown = new Int32Array(2 * this.kept.length);
      grown.set(this.kept);
      this.kept = grown;
    }
    const k = this.kept;
    k[4 * i] = start;
    k[4 * i + 1] = end;
    k[4 * i + 2] = line;
    k[4 * i + 3] = last;
    this.table[slot] = hash | 0;
    this.table[slot + 1] = i + 1;
    if (4 * this.keptCount > this.table.length) this.grow();
    return false;
  }

  /** The slot (even index) of `hash`: where its last kept entity is, or the empty slot where it would go. */
  private findSlot(hash: number): number {
    const table = this.table;
    const mask = table.length - 2;
    let slot = (hash << 1) & mask;
    while (table[slot + 1] !== 0 && table[slot] !== hash) slot = (slot + 2) & mask;
    return slot;
  }

  /** Doubles the table; its entries are the last kept entity of each hash. */
  private grow(): void {
    const old = this.table;
    this.table = new Int32Array(2 * old.length);
    for (let slot = 0; slot < old.length; slot += 2) {
      if (old[slot + 1] === 0) continue;
      const to = this.findSlot(old[slot]);
      this.table[to] = old[slot];
      this.table[to + 1] = old[slot + 1];
    }
  }

  /** The earliest kept entity with the same groups as the text [start, end), walking the same-hash list from `i`; −1 for none. */
  private findDuplicate(i: number, start: number, end: number): number {
    let found = -1;
    for (; i >= 0; i = this.kept[4 * i + 3]) {
      if (haveSameGroups(this.text, { start: this.kept[4 * i], end: this.kept[4 * i + 1] }, { start, end })) found = i;
    }
    return found;
  }

  /** The piece builder and units (made now when no entity came). */
  finish(known: DocumentSoFar): { builder: PieceBuilder; units: UnitsInfo } {
    const builder = this.builder ?? this.start(known);
    return { builder, units: this.units! };
  }
}

/** The groups of an entity's text, except handles and owners, as `code value` strings. */
function getGroupList(text: string, span: SourceSpan): string[] {
  const sc = new GroupScanner(text, span.start);
  const out: string[] = [];
  while (sc.offset < span.end && sc.next()) {
    if (sc.code === 5 || sc.code === 330 || sc.code === 360 || sc.code === 102) continue;
    out.push(`${sc.code} ${sc.name}`);
  }
  return out;
}

function haveSameGroups(text: string, a: SourceSpan, b: SourceSpan): boolean {
  const ga = getGroupList(text, a);
  const gb = getGroupList(text, b);
  return ga.length === gb.length && ga.every((g, i) => g === gb[i]);
}

function reportNotes(builder: PieceBuilder, layers: ReturnType<typeof parseDxfDocument>['layers'], problems: RawFinding[]): void {
  const { notes } = builder;
  const related = (spans: SourceSpan[], message: string) => spans.slice(1, 1 + MAX_RELATED).map((span) => ({ span, message }));
  for (const [entity, spans] of notes.notAnalysed) {
    problems.push({
      checkId: 'not-analysed', messageId: 'entities', span: spans[0],
      data: { entity, count: spans.length }, related: related(spans, `Another ${entity}`),
    });
  }
  for (const [name, count] of notes.hiddenLayers) {
    const layer = layers.get(name);
    if (!layer) continue;
    const frozen = (layer.flags & 1) !== 0;
    const off = layer.colour < 0;
    const state = frozen && off ? 'frozen and off' : frozen ? 'frozen' : 'off';
    problems.push({ checkId: 'not-analysed', messageId: 'hiddenLayer', span: layer.span, data: { layer: name, state, count } });
  }
  for (const [layer, { count, span }] of notes.ignoredLayers) {
    problems.push({ checkId: 'not-analysed', messageId: 'ignoredLayer', span: layers.get(layer)?.span ?? span, data: { layer, count } });
  }
  if (notes.paperSpace.length > 0) {
    problems.push({
      checkId: 'not-analysed', messageId: 'paperSpace', span: notes.paperSpace[0],
      data: { count: notes.paperSpace.length }, related: related(notes.paperSpace, 'Another paper-space entity'),
    });
  }
  for (const o of notes.outOfPlane) {
    problems.push({ checkId: 'out-of-plane', messageId: 'tilted', span: o.span, data: { entity: o.entity, detail: o.detail } });
  }
  for (const m of notes.malformed) {
    problems.push({ checkId: 'parse-error', messageId: 'dxf', span: m.span, data: { detail: m.detail } });
  }
}

/** A number for a DXF value line: shortest round-trip text, never exponent notation. */
export function formatDxfNumber(v: number): string {
  const s = String(v);
  if (!s.includes('e')) return s;
  return v.toFixed(15).replace(/0+$/, '').replace(/\.$/, '');
}

/** Replaces a value line's text after its leading blanks. */
function replaceValue(text: string, start: number, end: number, newText: string): TextEdit {
  let s = start;
  while (s < end && (text.charCodeAt(s) === 32 || text.charCodeAt(s) === 9)) s++;
  return { span: { start: s, end }, newText };
}

function getValueText(text: string, start: number, end: number): string {
  return text.slice(start, end).trim();
}

/** What a close fix needs of the first or last piece of a chain. */
interface FixPiece {
  readonly element: string;
  readonly startSpan: SourceSpan;
  readonly endSpan: SourceSpan;
  readonly startEdit?: PointGroups;
  readonly endEdit?: PointGroups;
  readonly polyline?: PolylineFixInfo;
}

function getFixPiece(store: PieceStore, i: number): FixPiece {
  return {
    element: store.getElement(i), startSpan: store.getSpan(i, 1), endSpan: store.getSpan(i, 2),
    startEdit: store.getStartEdit(i), endEdit: store.getEndEdit(i), polyline: store.getPolyline(i),
  };
}

/** The first or last piece of a chain and whether the chain walks it backwards. */
interface ChainEnd {
  readonly piece: FixPiece;
  readonly reversed: boolean;
}

/** Where a contour's start and end points are: x, y of the start, then of the end. */
type Gap = Float64Array;

/** Where buildContours reads each contour's start point. */
const startView = new SegmentView();

/**
 * Contours from the pieces: closed pieces as they are, open ones chained; numbered in the order of
 * their first entity (closed pieces before chains of the same order, each list in its own order),
 * their `Segment` objects made once, in that order.
 */
function buildContours(text: string, store: PieceStore, units: UnitsInfo, eol: string, fixMaxGapMm: number, problems: RawFinding[]): Contour[] {
  const n = store.pieceCount;
  // Closed pieces and open ones, each in piece order.
  let closedCount = 0, openCount = 0;
  const closedPieces = new Int32Array(n);
  const open = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    if (store.getSegmentCount(i) === 0) continue;
    if (store.isClosed(i)) closedPieces[closedCount++] = i;
    else open[openCount++] = i;
  }
  const ends = new Float64Array(4 * openCount);
  const groups = new Int32Array(openCount);
  for (let k = 0; k < openCount; k++) {
    store.getEndPoint(open[k], false, ends, 4 * k);
    store.getEndPoint(open[k], true, ends, 4 * k + 2);
    groups[k] = store.getLayerId(open[k]);
  }
  const chained = chainPieces({ ends, groups }, CHAIN_TOLERANCE_MM);

  for (const br of chained.branches) {
    const ps = br.pieces.map((k) => open[k]);
    problems.push({
      checkId: 'branching', messageId: 'branch', span: store.getSpan(ps[0], 0),
      data: { count: ps.length, xMm: br.x, yMm: br.y },
      related: ps.slice(1, 1 + MAX_RELATED).map((i) => ({ span: store.getSpan(i, 0), message: `This ${store.getElement(i)} also ends here` })),
    });
  }

  const chainCount = getChainCount(chained);
  const links = chained.links;
  /** The chain's closed flag after the single-polyline rule. */
  const chainClosed = new Uint8Array(chainCount);
  /**
   * The chain's order: that of its lowest piece, as orders never decrease from piece to piece. Chains
   * come by their lowest piece, so their orders never decrease either.
   */
  const chainOrder = new Int32Array(chainCount);
  const fixes = new Map<number, Fix>();
  const gap: Gap = new Float64Array(4);
  for (let k = 0; k < chainCount; k++) {
    const from = chained.starts[k], to = chained.starts[k + 1];
    const firstK = links[from] >> 1, lastK = links[to - 1] >> 1;
    const firstReversed = (links[from] & 1) === 1, lastReversed = (links[to - 1] & 1) === 1;
    let lowest = firstK;
    for (let l = from + 1; l < to; l++) lowest = Math.min(lowest, links[l] >> 1);
    chainOrder[k] = store.getOrder(open[lowest]);
    const first = open[firstK];
    const single = to - from === 1 && store.isUnflaggedPolyline(first);
    const closed = chained.closed[k] === 1 && !single;
    chainClosed[k] = closed ? 1 : 0;
    if (closed) continue;
    // The chain's start and end points: the ends by which it leaves its first and last pieces.
    const s = 4 * firstK + (firstReversed ? 2 : 0), e = 4 * lastK + (lastReversed ? 0 : 2);
    gap[0] = ends[s];
    gap[1] = ends[s + 1];
    gap[2] = ends[e];
    gap[3] = ends[e + 1];
    const gapMm = getVectorLength(gap[2] - gap[0], gap[3] - gap[1]);
    if (!(gapMm <= fixMaxGapMm)) continue;
    const firstEnd = { piece: getFixPiece(store, first), reversed: firstReversed };
    const closeFix = single
      ? getPolylineCloseFix(text, firstEnd.piece, gapMm, eol)
      : getMoveEndFix(text, firstEnd, { piece: getFixPiece(store, open[lastK]), reversed: lastReversed }, gap, gapMm, units);
    if (closeFix) fixes.set(k, closeFix);
  }

  // Closed pieces and chains merged by order, a closed piece first on a tie: each contour's pieces
  // (walked backwards where reversed) in `seq`, contour `index` at seq[seqStart[index]…].
  const contourCount = closedCount + chainCount;
  const seq = new Int32Array(closedCount + links.length), reversed = new Uint8Array(seq.length);
  const seqStart = new Int32Array(contourCount + 1);
  /** The chain of each contour, or −1 for a closed piece. */
  const chainOf = new Int32Array(contourCount);
  let used = 0, nextClosed = 0, nextChain = 0;
  for (let index = 0; index < contourCount; index++) {
    seqStart[index] = used;
    if (nextClosed < closedCount && (nextChain === chainCount || store.getOrder(closedPieces[nextClosed]) <= chainOrder[nextChain])) {
      chainOf[index] = -1;
      seq[used++] = closedPieces[nextClosed++];
    } else {
      const k = nextChain++;
      chainOf[index] = k;
      for (let l = chained.starts[k]; l < chained.starts[k + 1]; l++) {
        seq[used] = open[links[l] >> 1];
        reversed[used++] = links[l] & 1;
      }
    }
  }
  seqStart[contourCount] = used;
  const { segments, starts } = store.getSegmentsInOrder(seq, reversed, used);
  const contours: Contour[] = new Array<Contour>(contourCount);
  for (let index = 0; index < contourCount; index++) {
    const from = seqStart[index], to = seqStart[index + 1];
    const p = seq[from], last = seq[to - 1], k = chainOf[index];
    const span = store.getSpan(p, 0);
    // A contour starts at its first piece's start (its end when walked backwards) and ends at its last piece's end.
    const startSpan = store.getSpanLike(p, reversed[from] ? 2 : 1, span);
    const endSpan = store.getSpanLike(last, reversed[to - 1] ? 1 : 2, span);
    const first = segments.load(startView, starts[from]);
    contours[index] = withStoredSegments({
      index, closed: k < 0 || chainClosed[k] === 1,
      startX: first.x0, startY: first.y0,
      span, startSpan, endSpan, elementSpan: span,
      element: store.getElement(p), id: store.getHandle(p, text), layer: store.getLayer(p),
      closeFix: k < 0 ? undefined : fixes.get(k),
    }, { store: segments, first: starts[from], count: starts[to] - starts[from] });
  }
  return contours;
}

/**
 * Near-closed LWPOLYLINE / POLYLINE: set the closed flag and drop the last vertex, so the closing
 * segment runs from the last-but-one vertex to the first (the end moves onto the start; when the last
 * vertex repeats the first, nothing else changes).
 */
function getPolylineCloseFix(text: string, p: FixPiece, gapMm: number, eol: string): Fix | undefined {
  const info = p.polyline;
  if (!info || info.vertexCount < 3) return undefined;
  const edits: TextEdit[] = [];
  const flags = String(info.flags | 1);
  if (info.flagsSpan) {
    edits.push(replaceValue(text, info.flagsSpan.start, info.flagsSpan.end, flags));
  } else {
    // Pad the new code like the code line it is inserted before (codes are often right-justified).
    const lineEnd = text.indexOf('\n', info.insertFlagsAt);
    const nextCode = text.slice(info.insertFlagsAt, lineEnd < 0 ? text.length : lineEnd).replace(/\r$/, '');
    const code = '70'.padStart(nextCode.length, ' ');
    edits.push({ span: { start: info.insertFlagsAt, end: info.insertFlagsAt }, newText: `${code}${eol}${flags}${eol}` });
  }
  if (info.countSpan) edits.push(replaceValue(text, info.countSpan.start, info.countSpan.end, String(info.vertexCount - 1)));
  edits.push({ span: info.lastVertexSpan, newText: '' });
  edits.sort((a, b) => a.span.start - b.span.start);
  return {
    title: fillTemplate('Close the {entity}: drop its last vertex ({gapMm} mm from the first) and set the closed flag', { entity: p.element, gapMm }),
    edits,
  };
}

/**
 * Near-closed chain: move one free end onto the other, editing only that point's value lines. `gap`
 * holds the chain's start and end points (mm), `gapMm` their distance.
 */
function getMoveEndFix(text: string, first: ChainEnd, last: ChainEnd, gap: Gap, gapMm: number, units: UnitsInfo): Fix | undefined {
  /** The value spans of a chain end's point, looked up in its entity's text. */
  const refAt = (end: ChainEnd, atPieceEnd: boolean): PointRef | undefined => {
    const which = atPieceEnd ? end.piece.endEdit : end.piece.startEdit;
    return which && findPointRef(text, atPieceEnd ? end.piece.endSpan : end.piece.startSpan, which);
  };
  const startRef = refAt(first, first.reversed);
  const endRef = refAt(last, !last.reversed);
  const sx = gap[0], sy = gap[1], ex = gap[2], ey = gap[3];
  const target = (ref: PointRef | undefined, xMm: number, yMm: number): [string, string] =>
    ref
      ? [getValueText(text, ref.xs, ref.xe), getValueText(text, ref.ys, ref.ye)]
      : [formatDxfNumber(xMm / units.mmPerUnit), formatDxfNumber(yMm / units.mmPerUnit)];
  let moved: PointRef;
  let to: [string, string];
  let element: string;
  if (endRef) {
    moved = endRef;
    to = target(startRef, sx, sy);
    element = last.piece.element;
  } else if (startRef) {
    moved = startRef;
    to = target(undefined, ex, ey);
    element = first.piece.element;
  } else {
    return undefined;
  }
  return {
    title: `Move the end of the ${element} onto the other end of the contour (${formatNumber(gapMm)} mm away)`,
    edits: [replaceValue(text, moved.xs, moved.xe, to[0]), replaceValue(text, moved.ys, moved.ye, to[1])],
  };
}
