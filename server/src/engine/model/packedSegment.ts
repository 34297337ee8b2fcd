/**
 * Segments kept as numbers. A segment object with its numbers as fields holds each number as a heap
 * box of its own (V8 keeps no double unboxed in an object), so a line is 5 heap objects and an arc 13;
 * and even one small object a segment, a million of them outliving the reading, is what every
 * young-generation collection copies. So the readers keep a drawing's segments in a SegmentStore
 * (kinds, offsets and spans in typed arrays, coordinates in Float64Array chunks), a contour carries
 * where its own are (`Contour.stored`) and makes its segment objects on the first read of `segments`,
 * and the engine's loops (measures, pieces, checks, flattening) read each in place through a
 * SegmentView (`getSegmentAt`): an analysis makes no object per segment. A made segment satisfies the
 * `Segment` interfaces field for field (getters), so no reader of segments can tell it from a plain
 * one, except that it is not plain data: a spread or `Object.keys` sees its array and offsets, not its
 * coordinates. Nothing in the engine copies segments that way; tests compare them through a plain copy
 * (test/support/shapes.ts `toPlainSegment`).
 *
 * Layout at offset o: the coordinates in `Segment` field order after `kind` (line x0 y0 x1 y1; quad
 * … x2 y2; cubic … x3 y3; arc x0 y0 x1 y1 cx cy ux uy vx vy theta0 sweep).
 */
import type { Segment, SourceSpan } from '../types';
import { keepShape } from '../keepShape';

const NO_COORDINATES = new Float64Array(0);

/**
 * A segment read in place: its kind, the array and offset of its coordinates (layout above) and its
 * span's two offsets (the `span` object is made when asked for, a new object each time), with a getter
 * for every field of every kind, of which only its own kind's mean anything. Both the segments a
 * contour makes (`SegmentStore.makeSegment`, never changed after) and the views that the engine's loops
 * point at one stored segment after another (`SegmentStore.load`, `getSegmentAt`) are SegmentViews, so
 * a function that reads segments meets one layout for every stored segment.
 */
export class SegmentView {
  constructor(
    public kind: Segment['kind'] = 'line',
    public c: Float64Array = NO_COORDINATES,
    public o = 0,
    public spanStart = 0,
    public spanEnd = 0,
  ) {}

  get span(): SourceSpan { return { start: this.spanStart, end: this.spanEnd }; }
  get x0(): number { return this.c[this.o]!; }
  get y0(): number { return this.c[this.o + 1]!; }
  get x1(): number { return this.c[this.o + 2]!; }
  get y1(): number { return this.c[this.o + 3]!; }
  get x2(): number { return this.c[this.o + 4]!; }
  get y2(): number { return this.c[this.o + 5]!; }
  get x3(): number { return this.c[this.o + 6]!; }
  get y3(): number { return this.c[this.o + 7]!; }
  get cx(): number { return this.c[this.o + 4]!; }
  get cy(): number { return this.c[this.o + 5]!; }
  get ux(): number { return this.c[this.o + 6]!; }
  get uy(): number { return this.c[this.o + 7]!; }
  get vx(): number { return this.c[this.o + 8]!; }
  get vy(): number { return this.c[this.o + 9]!; }
  get theta0(): number { return this.c[this.o + 10]!; }
  get sweep(): number { return this.c[this.o + 11]!; }
}

/**
 * One segment view kept for the life of the process for its layout (keepShape.ts): without it, a full
 * collection after an analysis's segments became garbage took the optimised code of every function that
 * reads segments (measures, bounds, pieces, hull), and the next analysis ran unoptimised until the
 * compiler caught up (~10 % of the steady state on 1e5 loose DXF entities, with the packed segment
 * objects of that time).
 */
keepShape(new SegmentView());

/** The same segment with another span (a stored one shares its coordinates). */
export function withSpan(s: Segment, span: SourceSpan): Segment {
  return s instanceof SegmentView ? new SegmentView(s.kind, s.c, s.o, span.start, span.end) as unknown as Segment : { ...s, span };
}

/** Kind codes of a SegmentStore (and of `SegmentStore.of`'s kinds), by position in KIND_NAMES. */
export const SEGMENT_LINE = 0, SEGMENT_QUAD = 1, SEGMENT_CUBIC = 2, SEGMENT_ARC = 3;
const KIND_NAMES = ['line', 'quad', 'cubic', 'arc'] as const;

/**
 * Segments kept as numbers: for each its kind, the chunk and offset of its coordinates (layout above)
 * and its span's two offsets, in typed arrays. A reader writes a whole drawing here and makes no
 * object per segment; `makeSegment` makes one when asked for, and `load` points a view at one (the
 * objects cost ~20 % of analysing a 1e6-segment path, DEVELOPERS.md). Coordinates go to chunks that
 * are never moved, each twice the last up to MAX_CHUNK numbers, the first sized by the caller's
 * estimate, so a small drawing holds little and a huge one no huge copy.
 */
export class SegmentStore implements SegmentSink<void> {
  /** The chunk `reserve` last returned an offset into. */
  chunk: Float64Array;
  private used = 0;
  private chunks: Float64Array[] = [];
  /** Segments stored so far (positions 0 … count − 1); only the store changes it. */
  count = 0;
  private kinds: Uint8Array = new Uint8Array(16);
  private chunkOf: Int32Array = new Int32Array(16);
  private offsets: Int32Array = new Int32Array(16);
  private spanStarts: Int32Array = new Int32Array(16);
  private spanEnds: Int32Array = new Int32Array(16);

  constructor(estimate: number) {
    this.chunk = new Float64Array(Math.min(MAX_CHUNK, Math.max(16, estimate)));
    this.chunks.push(this.chunk);
  }

  /**
   * A store of segments laid out already: all coordinates in `coordinates` (layout above), and per
   * segment its kind code (SEGMENT_LINE …), offset and span. The arrays are taken,
   * not copied; nothing is added to the store after.
   */
  static of(coordinates: Float64Array, kinds: Uint8Array, offsets: Int32Array, spanStarts: Int32Array, spanEnds: Int32Array): SegmentStore {
    const store = new SegmentStore(0);
    store.chunk = coordinates;
    store.chunks = [coordinates];
    store.used = coordinates.length;
    store.count = kinds.length;
    store.kinds = kinds;
    store.chunkOf = new Int32Array(kinds.length);
    store.offsets = offsets;
    store.spanStarts = spanStarts;
    store.spanEnds = spanEnds;
    return store;
  }

  /** Room for n coordinates: their offset in `chunk` (a new chunk when the current one is full). */
  private reserve(n: number): number {
    if (this.used + n > this.chunk.length) {
      this.chunk = new Float64Array(Math.max(n, Math.min(MAX_CHUNK, 2 * this.chunk.length)));
      this.chunks.push(this.chunk);
      this.used = 0;
    }
    const o = this.used;
    this.used += n;
    return o;
  }

  /** Records segment `count` of `kind`, its coordinates at `o` in the current chunk. */
  private record(kind: number, o: number, spanStart: number, spanEnd: number): void {
    const i = this.count;
    if (i === this.kinds.length) this.grow();
    this.kinds[i] = kind;
    this.chunkOf[i] = this.chunks.length - 1;
    this.offsets[i] = o;
    this.spanStarts[i] = spanStart;
    this.spanEnds[i] = spanEnd;
    this.count = i + 1;
  }

  private grow(): void {
    const n = 2 * this.kinds.length;
    const kinds = new Uint8Array(n), chunkOf = new Int32Array(n), offsets = new Int32Array(n);
    const spanStarts = new Int32Array(n), spanEnds = new Int32Array(n);
    kinds.set(this.kinds); chunkOf.set(this.chunkOf); offsets.set(this.offsets);
    spanStarts.set(this.spanStarts); spanEnds.set(this.spanEnds);
    this.kinds = kinds; this.chunkOf = chunkOf; this.offsets = offsets;
    this.spanStarts = spanStarts; this.spanEnds = spanEnds;
  }

  line(x0: number, y0: number, x1: number, y1: number, spanStart: number, spanEnd: number): void {
    const o = this.reserve(4), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1;
    this.record(SEGMENT_LINE, o, spanStart, spanEnd);
  }

  quad(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, spanStart: number, spanEnd: number): void {
    const o = this.reserve(6), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = x2; c[o + 5] = y2;
    this.record(SEGMENT_QUAD, o, spanStart, spanEnd);
  }

  cubic(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, spanStart: number, spanEnd: number): void {
    const o = this.reserve(8), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = x2; c[o + 5] = y2; c[o + 6] = x3; c[o + 7] = y3;
    this.record(SEGMENT_CUBIC, o, spanStart, spanEnd);
  }

  arc(
    x0: number, y0: number, x1: number, y1: number, cx: number, cy: number,
    ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number, spanStart: number, spanEnd: number,
  ): void {
    const o = this.reserve(12), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = cx; c[o + 5] = cy;
    c[o + 6] = ux; c[o + 7] = uy; c[o + 8] = vx; c[o + 9] = vy; c[o + 10] = theta0; c[o + 11] = sweep;
    this.record(SEGMENT_ARC, o, spanStart, spanEnd);
  }

  /** Segment i as an object of its own. */
  makeSegment(i: number): Segment {
    return new SegmentView(KIND_NAMES[this.kinds[i]!]!, this.chunks[this.chunkOf[i]!]!, this.offsets[i]!, this.spanStarts[i]!, this.spanEnds[i]!) as unknown as Segment;
  }

  /** Points `view` at segment i; returns it. */
  load(view: SegmentView, i: number): SegmentView {
    view.kind = KIND_NAMES[this.kinds[i]!]!;
    view.c = this.chunks[this.chunkOf[i]!]!;
    view.o = this.offsets[i]!;
    view.spanStart = this.spanStarts[i]!;
    view.spanEnd = this.spanEnds[i]!;
    return view;
  }
}

/**
 * Something that takes segments by their fields: a store (SegmentStore) or plain objects
 * (`plainSegments`). The span comes as its two offsets, so a stored segment needs no span object.
 */
export interface SegmentSink<T = Segment> {
  line(x0: number, y0: number, x1: number, y1: number, spanStart: number, spanEnd: number): T;
  quad(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, spanStart: number, spanEnd: number): T;
  cubic(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, spanStart: number, spanEnd: number): T;
  arc(
    x0: number, y0: number, x1: number, y1: number, cx: number, cy: number,
    ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number, spanStart: number, spanEnd: number,
  ): T;
}

/** Plain segment objects, for the few segments made outside a drawing's bulk (fixes, small shapes). */
export const plainSegments: SegmentSink = {
  line: (x0, y0, x1, y1, start, end) => ({ kind: 'line', x0, y0, x1, y1, span: { start, end } }),
  quad: (x0, y0, x1, y1, x2, y2, start, end) => ({ kind: 'quad', x0, y0, x1, y1, x2, y2, span: { start, end } }),
  cubic: (x0, y0, x1, y1, x2, y2, x3, y3, start, end) => ({ kind: 'cubic', x0, y0, x1, y1, x2, y2, x3, y3, span: { start, end } }),
  arc: (x0, y0, x1, y1, cx, cy, ux, uy, vx, vy, theta0, sweep, start, end) => ({ kind: 'arc', x0, y0, x1, y1, cx, cy, ux, uy, vx, vy, theta0, sweep, span: { start, end } }),
};

/** Largest chunk of a SegmentStore: 512 KB. */
const MAX_CHUNK = 1 << 16;

/** A contour's segments kept in a store: its positions [first, first + count). */
export interface StoredSegments {
  readonly store: SegmentStore;
  readonly first: number;
  readonly count: number;
}

/** The getter of `segments` that withStoredSegments gives: makes them, and puts them in its place. */
function makeStoredSegments(this: { readonly stored: StoredSegments }): readonly Segment[] {
  const { store, first, count } = this.stored;
  const made = new Array<Segment>(count);
  for (let i = 0; i < count; i++) made[i] = store.makeSegment(first + i);
  Object.defineProperty(this, 'segments', { value: made, enumerable: true, configurable: true });
  return made;
}

const STORED_SEGMENTS: PropertyDescriptor = { get: makeStoredSegments, enumerable: true, configurable: true };

/**
 * `fields` with `stored` and a `segments` made from it on first read and kept then (an own, enumerable
 * accessor until then, so a spread or a destructuring reads the segments like a data field). One
 * getter serves every contour: a drawing of 250 000 contours makes no function per contour.
 */
export function withStoredSegments<T extends object>(fields: T, stored: StoredSegments): T & { readonly stored: StoredSegments; readonly segments: readonly Segment[] } {
  const contour = fields as T & { stored: StoredSegments; readonly segments: readonly Segment[] };
  contour.stored = stored;
  return Object.defineProperty(contour, 'segments', STORED_SEGMENTS);
}

/** What getSegmentAt reads: a contour's segments, stored or as objects. */
interface SegmentsOf {
  readonly segments: readonly Segment[];
  readonly stored?: StoredSegments | undefined;
}

/**
 * Segment i of a contour: its object, or for stored segments `view` pointed at it (valid until the
 * view is loaded again), so a loop that looks at each segment once makes no object.
 */
export function getSegmentAt(contour: SegmentsOf, i: number, view: SegmentView): Segment {
  const s = contour.stored;
  return s === undefined ? contour.segments[i]! : s.store.load(view, s.first + i) as unknown as Segment;
}

/** How many segments a contour has, without making stored ones. */
export function getSegmentCount(contour: SegmentsOf): number {
  const s = contour.stored;
  return s === undefined ? contour.segments.length : s.count;
}
