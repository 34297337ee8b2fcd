/**
 * The pieces of a DXF drawing as flat records: segment coordinates in one growing Float64Array, spans,
 * kinds and piece facts in Int32Arrays, names (entity types, layers) once each. A million-entity file
 * then holds no object per piece or per segment while it is read and chained; the result's segments
 * are written once, packed, in contour order and drawing direction (`getSegmentsInOrder`).
 */
import { SEGMENT_ARC as ARC, SEGMENT_CUBIC as CUBIC, SEGMENT_LINE as LINE, SEGMENT_QUAD as QUAD, SegmentStore } from '../../model/packedSegment';
import type { Segment, SourceSpan } from '../../types';
import type { PointGroups } from './entities';
import type { Affine } from './transform';

/** What a single-polyline contour needs for its close fix. */
export interface PolylineFixInfo {
  readonly kind: 'lwpolyline' | 'polyline';
  readonly flags: number;
  readonly flagsSpan?: SourceSpan;
  readonly countSpan?: SourceSpan;
  readonly insertFlagsAt: number;
  readonly vertexCount: number;
  /** The last vertex's text (LWPOLYLINE: its groups; POLYLINE: its VERTEX entity). */
  readonly lastVertexSpan: SourceSpan;
}

/** The facts of one piece that are not geometry, as given to `addPiece` (spans as numbers: no object per piece). */
export interface PieceFacts {
  /** Closed by the file (circle, full ellipse, closed polyline or spline). */
  readonly closed: boolean;
  /** Position of the top-level entity in the ENTITIES section (contour order); never below the last piece's. */
  readonly order: number;
  /** The span of the top-level entity (or INSERT) the piece comes from. */
  readonly spanStart: number;
  readonly spanEnd: number;
  readonly element: string;
  /** Where the top-level entity's handle is written (−1, −1 for none): the handle is that text, trimmed. */
  readonly handleStart: number;
  readonly handleEnd: number;
  readonly layer: string;
  /** The spans of the text that holds the piece's start and end points. */
  readonly startSpanStart: number;
  readonly startSpanEnd: number;
  readonly endSpanStart: number;
  readonly endSpanEnd: number;
  /** Which groups in `startSpan` / `endSpan` hold the start / end point, when a fix may move it. */
  readonly startEdit?: PointGroups;
  readonly endEdit?: PointGroups;
  readonly polyline?: PolylineFixInfo;
  /** An LWPOLYLINE or POLYLINE without its closed flag: its ends meeting is still an open contour. */
  readonly unflaggedPolyline: boolean;
}

/** Number of coordinates of each segment kind (by SegmentStore's kind codes; `Segment` field order after `kind`). */
const COORDINATES = [4, 6, 8, 12];
/** Offset of the end point's x among a segment's coordinates, by kind. */
const END_AT = [2, 4, 6, 2];

/** Piece flag bits; a point-group code (0 none) sits at START_EDIT_SHIFT and END_EDIT_SHIFT. */
const CLOSED = 1, UNFLAGGED = 2, START_EDIT_SHIFT = 2, END_EDIT_SHIFT = 4;
const POINT_GROUPS: readonly (PointGroups | undefined)[] = [undefined, 'first10', 'last10', 'first11'];

function getPointGroupsCode(which: PointGroups | undefined): number {
  return which === undefined ? 0 : POINT_GROUPS.indexOf(which);
}

function grownInt32(a: Int32Array, size: number): Int32Array {
  if (size <= a.length) return a;
  const b = new Int32Array(Math.max(size, 2 * a.length));
  b.set(a);
  return b;
}

function grownFloat64(a: Float64Array, size: number): Float64Array {
  if (size <= a.length) return a;
  const b = new Float64Array(Math.max(size, 2 * a.length));
  b.set(a);
  return b;
}

/** Fields of a piece record: one past its last segment, order, flag bits, name ids, spans (start, end) ×3, handle span. */
const SEGMENT_END = 0, ORDER = 1, FLAGS = 2, ELEMENT = 3, LAYER = 4, SPANS = 5, HANDLE = 11;
const PIECE_WIDTH = 13;
/** Fields of a segment record: kind, first coordinate, span start and end. */
const KIND = 0, COORDINATE_AT = 1, SPAN_START = 2, SPAN_END = 3;
const SEGMENT_WIDTH = 4;

/**
 * Pieces and segments as records in two Int32Arrays (a piece's or a segment's fields share a cache
 * line: chaining visits pieces in shuffled order) and coordinates in a Float64Array.
 */
export class PieceStore {
  /** Number of pieces. */
  pieceCount = 0;
  private segmentCount = 0;
  private coordinateCount = 0;
  private pieces: Int32Array = new Int32Array(PIECE_WIDTH * 1024);
  private segments: Int32Array = new Int32Array(SEGMENT_WIDTH * 1024);
  /** Coordinates of each segment, in `Segment` field order after `kind`. */
  private coordinates: Float64Array = new Float64Array(8192);
  private readonly polylines = new Map<number, PolylineFixInfo>();
  /** Entity types and layer names by id, each once. */
  private readonly names: string[] = [];
  private readonly nameIds = new Map<string, number>();

  /** Drops every piece (see EntityReader.release); the store is not used again. */
  release(): void {
    this.pieceCount = this.segmentCount = this.coordinateCount = 0;
    this.pieces = new Int32Array(0);
    this.segments = new Int32Array(0);
    this.coordinates = new Float64Array(0);
    this.polylines.clear();
    this.names.length = 0;
    this.nameIds.clear();
  }

  private getNameId(name: string): number {
    let id = this.nameIds.get(name);
    if (id === undefined) {
      id = this.names.length;
      this.names.push(name);
      this.nameIds.set(name, id);
    }
    return id;
  }

  /** Reserves a segment of `kind` with its span and returns the index of its first coordinate. */
  private addSegmentSlot(kind: number, spanStart: number, spanEnd: number): number {
    const r = SEGMENT_WIDTH * this.segmentCount++;
    this.segments = grownInt32(this.segments, r + SEGMENT_WIDTH);
    const at = this.coordinateCount;
    this.coordinateCount += COORDINATES[kind];
    this.coordinates = grownFloat64(this.coordinates, this.coordinateCount);
    const sg = this.segments;
    sg[r + KIND] = kind;
    sg[r + COORDINATE_AT] = at;
    sg[r + SPAN_START] = spanStart;
    sg[r + SPAN_END] = spanEnd;
    return at;
  }

  /**
   * Adds a segment of the piece being built, with the given span: the segment itself when `m` is null,
   * else its exact image under `m` (an affine image of a Bézier is the Bézier of the mapped control
   * points; of an `Arc`, the arc with mapped ends and centre, conjugate semi-diameters mapped by the
   * linear part, the same angles — types.ts).
   */
  addSegment(m: Affine | null, s: Segment, spanStart: number, spanEnd: number): void {
    switch (s.kind) {
      case 'line':
        return this.addLine(m, s.x0, s.y0, s.x1, s.y1, spanStart, spanEnd);
      case 'arc':
        return this.addArc(m, s.x0, s.y0, s.x1, s.y1, s.cx, s.cy, s.ux, s.uy, s.vx, s.vy, s.theta0, s.sweep, spanStart, spanEnd);
      case 'quad': {
        const at = this.addSegmentSlot(QUAD, spanStart, spanEnd);
        this.putPoint(m, at, s.x0, s.y0);
        this.putPoint(m, at + 2, s.x1, s.y1);
        return this.putPoint(m, at + 4, s.x2, s.y2);
      }
      case 'cubic': {
        const at = this.addSegmentSlot(CUBIC, spanStart, spanEnd);
        this.putPoint(m, at, s.x0, s.y0);
        this.putPoint(m, at + 2, s.x1, s.y1);
        this.putPoint(m, at + 4, s.x2, s.y2);
        return this.putPoint(m, at + 6, s.x3, s.y3);
      }
    }
  }

  /** A line segment from (x0, y0) to (x1, y1), mapped by `m` unless it is null (as in `addSegment`). */
  addLine(m: Affine | null, x0: number, y0: number, x1: number, y1: number, spanStart: number, spanEnd: number): void {
    const at = this.addSegmentSlot(LINE, spanStart, spanEnd);
    this.putPoint(m, at, x0, y0);
    this.putPoint(m, at + 2, x1, y1);
  }

  /** An arc with the fields of `Arc`, mapped by `m` unless it is null (as in `addSegment`). */
  addArc(
    m: Affine | null, x0: number, y0: number, x1: number, y1: number, cx: number, cy: number,
    ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number, spanStart: number, spanEnd: number,
  ): void {
    const at = this.addSegmentSlot(ARC, spanStart, spanEnd);
    this.putPoint(m, at, x0, y0);
    this.putPoint(m, at + 2, x1, y1);
    this.putPoint(m, at + 4, cx, cy);
    const c = this.coordinates;
    c[at + 6] = m ? m.a * ux + m.c * uy : ux;
    c[at + 7] = m ? m.b * ux + m.d * uy : uy;
    c[at + 8] = m ? m.a * vx + m.c * vy : vx;
    c[at + 9] = m ? m.b * vx + m.d * vy : vy;
    c[at + 10] = theta0;
    c[at + 11] = sweep;
  }

  /** Writes the image of point (x, y) under `m` (or the point, when `m` is null) at coordinate `at`. */
  private putPoint(m: Affine | null, at: number, x: number, y: number): void {
    const c = this.coordinates;
    c[at] = m ? m.a * x + m.c * y + m.e : x;
    c[at + 1] = m ? m.b * x + m.d * y + m.f : y;
  }

  /** Ends the piece whose segments were added since the last piece. */
  addPiece(facts: PieceFacts): void {
    const i = this.pieceCount++;
    const r = PIECE_WIDTH * i;
    this.pieces = grownInt32(this.pieces, r + PIECE_WIDTH);
    const p = this.pieces;
    p[r + SEGMENT_END] = this.segmentCount;
    p[r + ORDER] = facts.order;
    p[r + FLAGS] = (facts.closed ? CLOSED : 0) | (facts.unflaggedPolyline ? UNFLAGGED : 0)
      | (getPointGroupsCode(facts.startEdit) << START_EDIT_SHIFT) | (getPointGroupsCode(facts.endEdit) << END_EDIT_SHIFT);
    p[r + ELEMENT] = this.getNameId(facts.element);
    p[r + LAYER] = this.getNameId(facts.layer);
    p[r + SPANS] = facts.spanStart; p[r + SPANS + 1] = facts.spanEnd;
    p[r + SPANS + 2] = facts.startSpanStart; p[r + SPANS + 3] = facts.startSpanEnd;
    p[r + SPANS + 4] = facts.endSpanStart; p[r + SPANS + 5] = facts.endSpanEnd;
    p[r + HANDLE] = facts.handleStart; p[r + HANDLE + 1] = facts.handleEnd;
    if (facts.polyline) this.polylines.set(i, facts.polyline);
  }

  private getFirstSegment(i: number): number {
    return i === 0 ? 0 : this.pieces[PIECE_WIDTH * (i - 1) + SEGMENT_END];
  }

  private getSegmentEnd(i: number): number {
    return this.pieces[PIECE_WIDTH * i + SEGMENT_END];
  }

  getSegmentCount(i: number): number {
    return this.getSegmentEnd(i) - this.getFirstSegment(i);
  }

  isClosed(i: number): boolean {
    return (this.pieces[PIECE_WIDTH * i + FLAGS] & CLOSED) !== 0;
  }

  isUnflaggedPolyline(i: number): boolean {
    return (this.pieces[PIECE_WIDTH * i + FLAGS] & UNFLAGGED) !== 0;
  }

  getOrder(i: number): number {
    return this.pieces[PIECE_WIDTH * i + ORDER];
  }

  /** The id of the piece's layer name (ids are small integers, equal for equal names). */
  getLayerId(i: number): number {
    return this.pieces[PIECE_WIDTH * i + LAYER];
  }

  getLayer(i: number): string {
    return this.names[this.getLayerId(i)];
  }

  getElement(i: number): string {
    return this.names[this.pieces[PIECE_WIDTH * i + ELEMENT]];
  }

  /** The handle of the piece's top-level entity, read from the `text` the pieces come from. */
  getHandle(i: number, text: string): string | undefined {
    const r = PIECE_WIDTH * i + HANDLE;
    return this.pieces[r] < 0 ? undefined : text.slice(this.pieces[r], this.pieces[r + 1]).trim();
  }

  /** The piece's span (which = 0), start span (1) or end span (2), as a new object. */
  getSpan(i: number, which: 0 | 1 | 2): SourceSpan {
    const r = PIECE_WIDTH * i + SPANS + 2 * which;
    return { start: this.pieces[r], end: this.pieces[r + 1] };
  }

  /** The piece's span `which` (as in `getSpan`): `like` itself when it has the same values (one object for both). */
  getSpanLike(i: number, which: 0 | 1 | 2, like: SourceSpan): SourceSpan {
    const r = PIECE_WIDTH * i + SPANS + 2 * which;
    return this.pieces[r] === like.start && this.pieces[r + 1] === like.end ? like : { start: this.pieces[r], end: this.pieces[r + 1] };
  }

  getStartEdit(i: number): PointGroups | undefined {
    return POINT_GROUPS[(this.pieces[PIECE_WIDTH * i + FLAGS] >> START_EDIT_SHIFT) & 3];
  }

  getEndEdit(i: number): PointGroups | undefined {
    return POINT_GROUPS[(this.pieces[PIECE_WIDTH * i + FLAGS] >> END_EDIT_SHIFT) & 3];
  }

  getPolyline(i: number): PolylineFixInfo | undefined {
    return this.polylines.get(i);
  }

  /** The piece's start (atEnd false) or end point, x then y, into `out` at `k`. */
  getEndPoint(i: number, atEnd: boolean, out: Float64Array, k: number): void {
    const r = SEGMENT_WIDTH * (atEnd ? this.getSegmentEnd(i) - 1 : this.getFirstSegment(i));
    const at = this.segments[r + COORDINATE_AT] + (atEnd ? END_AT[this.segments[r + KIND]] : 0);
    out[k] = this.coordinates[at];
    out[k + 1] = this.coordinates[at + 1];
  }

  /**
   * The segments of the pieces seq[0..count) (each piece at most once) in that order, a piece walked
   * backwards where reversed[k] is 1 (its segments in reverse order, each reversed: ends and control
   * points swapped, an arc by θ0' = θ0 + sweep, sweep' = −sweep), stored on one array of coordinates
   * (packedSegment.ts `SegmentStore`, no object per segment); starts[k] is the position of seq[k]'s
   * first segment in the store, starts[count] their number. The
   * pieces are read in stored order and each is written where `seq` puts it: walking `seq` instead
   * would cost a chain of dependent cache misses a piece (its record, its segments, its coordinates)
   * on a shuffled file, where these stores do not wait on one another.
   */
  getSegmentsInOrder(seq: Int32Array, reversed: Uint8Array, count: number): { segments: SegmentStore; starts: Int32Array } {
    const n = this.pieceCount, sg = this.segments, c = this.coordinates;
    /** The first coordinate of segment j (the end of them all for j = segmentCount). */
    const coordinateOf = (j: number) => (j < this.segmentCount ? sg[SEGMENT_WIDTH * j + COORDINATE_AT] : this.coordinateCount);
    // Each piece's numbers of segments and coordinates, in stored order (a piece's are consecutive).
    const segmentsOf = new Int32Array(n), coordinatesOf = new Int32Array(n);
    for (let i = 0, first = 0; i < n; i++) {
      const end = this.getSegmentEnd(i);
      segmentsOf[i] = end - first;
      coordinatesOf[i] = coordinateOf(end) - coordinateOf(first);
      first = end;
    }
    // Where each piece asked for goes (−1: not asked for).
    const segmentAt = new Int32Array(n).fill(-1), coordinateAt = new Int32Array(n), back = new Uint8Array(n);
    const starts = new Int32Array(count + 1);
    let segmentTotal = 0, coordinateTotal = 0;
    for (let k = 0; k < count; k++) {
      const i = seq[k];
      starts[k] = segmentTotal;
      segmentAt[i] = segmentTotal; coordinateAt[i] = coordinateTotal; back[i] = reversed[k];
      segmentTotal += segmentsOf[i];
      coordinateTotal += coordinatesOf[i];
    }
    starts[count] = segmentTotal;
    // The copy, in stored order.
    const d = new Float64Array(coordinateTotal);
    const kinds = new Uint8Array(segmentTotal), offsets = new Int32Array(segmentTotal);
    const spanStarts = new Int32Array(segmentTotal), spanEnds = new Int32Array(segmentTotal);
    for (let i = 0, first = 0; i < n; first += segmentsOf[i], i++) {
      if (segmentAt[i] < 0) continue;
      const pieceSegments = segmentsOf[i], from = coordinateOf(first), to = from + coordinatesOf[i];
      for (let k = 0; k < pieceSegments; k++) {
        const r = SEGMENT_WIDTH * (first + k);
        const a = sg[r + COORDINATE_AT], kind = sg[r + KIND], m = COORDINATES[kind];
        let t: number, o: number;
        if (!back[i]) {
          t = segmentAt[i] + k;
          o = coordinateAt[i] + (a - from);
          for (let j = 0; j < m; j++) d[o + j] = c[a + j];
        } else {
          t = segmentAt[i] + pieceSegments - 1 - k;
          o = coordinateAt[i] + (to - a - m);
          if (kind === ARC) {
            // Ends swapped, centre and semi-diameters kept, θ0' = θ0 + sweep, sweep' = −sweep.
            d[o] = c[a + 2]; d[o + 1] = c[a + 3]; d[o + 2] = c[a]; d[o + 3] = c[a + 1];
            for (let j = 4; j < 10; j++) d[o + j] = c[a + j];
            d[o + 10] = c[a + 10] + c[a + 11]; d[o + 11] = -c[a + 11];
          } else {
            // Control points in reverse order.
            for (let j = 0; j < m; j += 2) { d[o + j] = c[a + m - 2 - j]; d[o + j + 1] = c[a + m - 1 - j]; }
          }
        }
        kinds[t] = kind; offsets[t] = o; spanStarts[t] = sg[r + SPAN_START]; spanEnds[t] = sg[r + SPAN_END];
      }
    }
    return { segments: SegmentStore.of(d, kinds, offsets, spanStarts, spanEnds), starts };
  }
}
