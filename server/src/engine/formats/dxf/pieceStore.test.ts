import { describe, expect, it } from 'vitest';
import type { Arc, Segment } from '../../types';
import { toPlainSegment } from '../../../../../test/support/shapes';
import { PieceStore, type PieceFacts } from './pieceStore';
import type { SegmentStore } from '../../model/packedSegment';

/** Every segment of a store, each made as an object. */
const made = (store: SegmentStore): Segment[] => Array.from({ length: store.count }, (_, i) => store.makeSegment(i));

const span = { start: 0, end: 10 };
const facts: PieceFacts = {
  closed: false, order: 0, spanStart: 0, spanEnd: 10, element: 'LWPOLYLINE', handleStart: -1, handleEnd: -1, layer: '0',
  startSpanStart: 0, startSpanEnd: 10, endSpanStart: 0, endSpanEnd: 10, unflaggedPolyline: false,
};
const at = (x: number, y: number) => ({ x, y });
const arcPoint = (a: Arc, t: number) => at(a.cx + a.ux * Math.cos(t) + a.vx * Math.sin(t), a.cy + a.uy * Math.cos(t) + a.vy * Math.sin(t));

/** A store holding one piece of the given segments, read back forwards and backwards. */
function roundTrip(segments: Segment[]): { forward: Segment[]; backward: Segment[] } {
  const store = new PieceStore();
  for (const s of segments) store.addSegment(null, s, s.span.start, s.span.end);
  store.addPiece(facts);
  const forward = made(store.getSegmentsInOrder(Int32Array.of(0), Uint8Array.of(0), 1).segments);
  const backward = made(store.getSegmentsInOrder(Int32Array.of(0), Uint8Array.of(1), 1).segments);
  return { forward: forward.map(toPlainSegment), backward: backward.map(toPlainSegment) };
}

describe('PieceStore', () => {
  const a: Arc = { kind: 'arc', x0: 1, y0: 0, x1: 0, y1: 1, cx: 0, cy: 0, ux: 1, uy: 0, vx: 0, vy: 1, theta0: 0, sweep: Math.PI / 2, span: { start: 2, end: 4 } };
  const segments: Segment[] = [
    { kind: 'line', x0: -0, y0: 1e-300, x1: 0.1, y1: 2 ** 53, span },
    { kind: 'quad', x0: 0.1, y0: 2 ** 53, x1: 3, y1: 4, x2: 1, y2: 0, span },
    a,
    { kind: 'cubic', x0: 0, y0: 1, x1: 5, y1: 6, x2: 7, y2: 8, x3: 9, y3: 10, span: { start: 4, end: 10 } },
  ];

  it('gives back every segment field for field, −0 and extreme doubles included (IEEE 754 binary64, stored exactly)', () => {
    const { forward } = roundTrip(segments);
    expect(forward).toEqual(segments);
    expect(Object.is(forward[0].x0, -0)).toBe(true);
  });

  it('walks a piece backwards: segments in reverse order, each with its ends and control points swapped (common practice, no source)', () => {
    const { backward } = roundTrip(segments);
    expect(backward.map((s) => s.kind)).toEqual(['cubic', 'arc', 'quad', 'line']);
    expect(backward[0]).toMatchObject({ x0: 9, y0: 10, x1: 7, y1: 8, x2: 5, y2: 6, x3: 0, y3: 1 });
    expect(backward[2]).toMatchObject({ x0: 1, y0: 0, x1: 3, y1: 4, x2: 0.1, y2: 2 ** 53 });
    expect(backward[3]).toMatchObject({ x0: 0.1, y0: 2 ** 53, x1: -0, y1: 1e-300 });
  });

  it('reverses an arc by swapping its ends and running θ back (θ0 + sweep, −sweep; unit circle, handbook)', () => {
    const r = roundTrip([a]).backward[0] as Arc;
    expect([r.x0, r.y0, r.x1, r.y1]).toEqual([0, 1, 1, 0]);
    expect(r.sweep).toBe(-Math.PI / 2);
    // The point at the new start angle is the old end point; at the end angle, the old start point.
    expect(arcPoint(r, r.theta0).x).toBeCloseTo(0, 15);
    expect(arcPoint(r, r.theta0).y).toBeCloseTo(1, 15);
    expect(arcPoint(r, r.theta0 + r.sweep).x).toBeCloseTo(1, 15);
    expect(arcPoint(r, r.theta0 + r.sweep).y).toBeCloseTo(0, 15);
  });

  it('maps segments as an affine map does, conjugate semi-diameters of an arc by the linear part only (REFERENCES.md §6.4 INSERT mapping)', () => {
    const store = new PieceStore();
    const m = { a: 0, b: 2, c: -2, d: 0, e: 5, f: -1 }; // rotate 90°, scale 2, move by (5, −1)
    store.addSegment(m, a, 2, 4);
    store.addPiece(facts);
    const out = made(store.getSegmentsInOrder(Int32Array.of(0), Uint8Array.of(0), 1).segments);
    expect(toPlainSegment(out[0]!)).toEqual({ ...a, x0: 5, y0: 1, x1: 3, y1: -1, cx: 5, cy: -1, ux: 0, uy: 2, vx: -2, vy: 0, span: { start: 2, end: 4 } });
  });

  it('puts pieces in the order asked for, each forwards or backwards, and leaves out the pieces not asked for', () => {
    // Five pieces of 1 to 3 segments (of every kind), asked for in the order 3, 0, 4, 1 (2 left out), 0 and 4 backwards.
    const store = new PieceStore();
    const pieces = [segments.slice(0, 2), segments.slice(2, 3), segments.slice(1, 4), segments.slice(3, 4), segments.slice(0, 3)];
    for (const piece of pieces) {
      for (const s of piece) store.addSegment(null, s, s.span.start, s.span.end);
      store.addPiece(facts);
    }
    const order = [3, 0, 4, 1], back = [0, 1, 1, 0];
    const { segments: out, starts } = store.getSegmentsInOrder(Int32Array.from(order), Uint8Array.from(back), order.length);
    // Reference: each piece read alone, in the same direction, one after another.
    const alone = order.map((i, k) => {
      const one = new PieceStore();
      for (const s of pieces[i]!) one.addSegment(null, s, s.span.start, s.span.end);
      one.addPiece(facts);
      return made(one.getSegmentsInOrder(Int32Array.of(0), Uint8Array.of(back[k]!), 1).segments).map(toPlainSegment);
    });
    expect(made(out).map(toPlainSegment)).toEqual(alone.flat());
    expect([...starts]).toEqual([0, 1, 3, 6, 7]); // pieces of 1, 2, 3 and 1 segments
  });

  it('gives each segment the span it was stored with (piece span or its own)', () => {
    const { forward } = roundTrip(segments);
    expect(forward.map((s) => s.span)).toEqual([span, span, { start: 2, end: 4 }, { start: 4, end: 10 }]);
  });

  it('keeps piece facts: spans, point groups, names, handles and flags (common practice, no source)', () => {
    const store = new PieceStore();
    // Handles are read from the text: piece i's handle, when it has one, is " Hi" padded to 8 characters at 12i + 4.
    const text = Array.from({ length: 3000 }, (_, i) => `    ${` H${i}`.padEnd(8)}`).join('');
    for (let i = 0; i < 3000; i++) {
      store.addSegment(null, segments[i % 4], i, i + 1);
      store.addPiece({
        ...facts, order: i, closed: i % 3 === 0, unflaggedPolyline: i % 5 === 0, layer: `L${i % 7}`, element: i % 2 ? 'LINE' : 'ARC',
        handleStart: i % 11 === 0 ? 12 * i + 4 : -1, handleEnd: i % 11 === 0 ? 12 * i + 12 : -1,
        startEdit: i % 2 ? 'first10' : undefined, endEdit: i % 2 ? 'first11' : 'last10',
        spanStart: i, spanEnd: i + 9, startSpanStart: i + 1, startSpanEnd: i + 2, endSpanStart: i + 3, endSpanEnd: i + 4,
      });
    }
    expect(store.pieceCount).toBe(3000);
    const i = 2999;
    expect([store.getOrder(i), store.isClosed(i), store.isUnflaggedPolyline(i), store.getLayer(i), store.getElement(i), store.getHandle(i, text)])
      .toEqual([2999, false, false, 'L3', 'LINE', undefined]);
    expect([store.getSpan(i, 0), store.getSpan(i, 1), store.getSpan(i, 2)]).toEqual([{ start: 2999, end: 3008 }, { start: 3000, end: 3001 }, { start: 3002, end: 3003 }]);
    expect([store.getStartEdit(i), store.getEndEdit(i), store.getEndEdit(2998), store.getHandle(2992, text)]).toEqual(['first10', 'first11', 'last10', 'H2992']);
    expect(store.getLayerId(7)).toBe(store.getLayerId(0));
    const ends = new Float64Array(4);
    store.getEndPoint(2, false, ends, 0);
    store.getEndPoint(2, true, ends, 2);
    expect([...ends]).toEqual([1, 0, 0, 1]);
  });
});
