import { describe, expect, it } from 'vitest';
import type { Segment, TextEdit } from '../../types';
import { getSegmentEnd } from '../../geometry/bounds';
import { toPlainSegment } from '../../../../../test/support/shapes';
import { parsePathData, type PathSubpath } from './pathData';

// The fix's contract (REFERENCES §5.4, "move the last point onto the first and append Z"; the
// current point after Z is the subpath's start, SVG 2 Paths "The closepath command"): after the
// edits the subpath is closed, its end point is exactly its start point, and nothing else moves.

function applyEdits(text: string, base: number, edits: readonly TextEdit[]): string {
  let out = text;
  let limit = Infinity;
  for (const e of [...edits].sort((p, q) => q.span.start - p.span.start)) {
    expect(e.span.end).toBeLessThanOrEqual(limit); // edits must not overlap
    out = out.slice(0, e.span.start - base) + e.newText + out.slice(e.span.end - base);
    limit = e.span.start;
  }
  return out;
}

/** Segment geometry without spans (spans shift when text before them changes). */
function getGeometry(segments: readonly Segment[]): object[] {
  return segments.map((s) => {
    const { span: _span, ...rest } = toPlainSegment(s);
    return rest;
  });
}

function getSummary(s: PathSubpath): object {
  return { startX: s.startX, startY: s.startY, closed: s.closed, segments: getGeometry(s.segments) };
}

const BASE = 9;

/** Applies subpath `index`'s close fix to `d` and checks the contract; returns the fixed text. */
function checkCloseFix(d: string, index: number): { fixed: string; title: string } {
  const before = parsePathData(d, BASE);
  const sub = before.subpaths[index]!;
  expect(sub.closed).toBe(false);
  expect(sub.closeFix).toBeDefined();
  const fixed = applyEdits(d, BASE, sub.closeFix!.edits);
  const after = parsePathData(fixed, BASE);
  expect(after.error).toEqual(before.error === undefined ? undefined : expect.anything());
  expect(after.subpaths.length).toBe(before.subpaths.length);
  after.subpaths.forEach((s, k) => {
    if (k !== index) {
      expect(getSummary(s)).toEqual(getSummary(before.subpaths[k]!));
      return;
    }
    expect(s.closed).toBe(true);
    expect([s.startX, s.startY]).toEqual([sub.startX, sub.startY]);
    expect(getSegmentEnd(s.segments[s.segments.length - 1]!)).toEqual([s.startX, s.startY]); // gap 0, exactly
    expect(s.segments.length).toBe(sub.segments.length);
    // Every segment but the last is unchanged; the last keeps its start.
    expect(getGeometry(s.segments.slice(0, -1))).toEqual(getGeometry(sub.segments.slice(0, -1)));
    const [was, now] = [sub.segments.at(-1)!, s.segments.at(-1)!];
    expect([now.x0, now.y0]).toEqual([was.x0, was.y0]);
    // Control points of a moved Bézier stay where they were.
    if (was.kind === 'cubic') expect(now).toMatchObject({ kind: 'cubic', x1: was.x1, y1: was.y1, x2: was.x2, y2: was.y2 });
    if (was.kind === 'quad') expect(now).toMatchObject({ kind: 'quad', x1: was.x1, y1: was.y1 });
  });
  return { fixed, title: sub.closeFix!.title };
}

describe('close fix of an open subpath', () => {
  // Expected texts: the rule above applied by hand (common practice, no source beyond REFERENCES §5.4).
  const cases: { name: string; d: string; index?: number; fixed: string }[] = [
    { name: 'inserts Z when the end already is the start', d: 'M0 0 L10 0 L10 10 L0 0', fixed: 'M0 0 L10 0 L10 10 L0 0Z' },
    { name: 'rewrites the end of an absolute lineto', d: 'M0 0 L10 0 L10 10 L0 0.5', fixed: 'M0 0 L10 0 L10 10 L0 0Z' },
    { name: 'rewrites a V whose x is already the start x', d: 'M0 0H10V10H0V0.5', fixed: 'M0 0H10V10H0V0Z' },
    { name: 'replaces an H that cannot reach the start by a lineto', d: 'M0 0 H10 V10 H0.5', fixed: 'M0 0 H10 V10 L0 0Z' },
    { name: 'replaces a relative v off the start column', d: 'M0 0 h10 v10 h-9.5 v-10', fixed: 'M0 0 h10 v10 h-9.5 L0 0Z' },
    { name: 'rewrites a relative h on the start row', d: 'M0 10 v-10 h10 v10 h-9.5', fixed: 'M0 10 v-10 h10 v10 h-10Z' },
    { name: 'rewrites the last of repeated groups', d: 'M0 0 L10 0 10 10 0.5 0.5', fixed: 'M0 0 L10 0 10 10 0 0Z' },
    { name: 'rewrites the last implicit lineto of a relative moveto', d: 'm1 1 9 0 0 9 -8.5 -8.5', fixed: 'm1 1 9 0 0 9 -9 -9Z' },
    { name: 'keeps a rewritten number apart from the one before it', d: 'M20 0 L10 0 c0 5-5 10-9-1', fixed: 'M20 0 L10 0 c0 5-5 10 10 0Z' },
    { name: 'rewrites the end of an arc with glued flags', d: 'M0 0 A5 5 0 0 1 10 0 a5 5 0 0110 0.1', fixed: 'M0 0 A5 5 0 0 1 10 0 a5 5 0 01-10 0Z' },
    {
      name: 'rewrites a following relative m to absolute values',
      d: 'M0 0 L10 0 L10 10 L0 0.5 m20 20 l5 0', index: 0,
      fixed: 'M0 0 L10 0 L10 10 L0 0Z M20 20.5 l5 0',
    },
    {
      name: 'keeps the implicit linetos of a following relative m relative',
      d: 'M0 0 L10 0 L10 10 L0 0.5m20 20,5 0 5 5', index: 0,
      fixed: 'M0 0 L10 0 L10 10 L0 0ZM20 20.5l5 0 5 5',
    },
    { name: 'closes the subpath that starts after a Z', d: 'M0 0 h5 v5 z l5 5 l-4 -4.5 m1 1', index: 1, fixed: 'M0 0 h5 v5 z l5 5 l-5 -5Z M2 1.5' },
    { name: 'closes the last of several subpaths', d: 'M0 0 L1 1 M5 5 l1 0 0 1 -0.9 -0.9', index: 1, fixed: 'M0 0 L1 1 M5 5 l1 0 0 1 -1 -1Z' },
  ];
  it.each(cases)('$name', ({ d, index, fixed }) => {
    expect(checkCloseFix(d, index ?? 0).fixed).toBe(fixed);
  });

  it('names the fix after what it does', () => {
    expect(checkCloseFix('M0 0 L10 0 L10 10 L0 0', 0).title).toBe('Close the contour (add Z)');
    expect(checkCloseFix('M0 0 L10 0 L10 10 L0 1', 0).title).toBe('Close the contour (move the end onto the start and add Z)');
  });

  // (0.1 + 0.7) + (0.1 − (0.1 + 0.7)) ≠ 0.1 in doubles: no relative number reaches the start
  // exactly, so the group becomes an absolute command (IEEE 754 binary64 rounding).
  const p = 0.1 + 0.7; // the current point's x after `M0.1 0.2 l0.7 0.3` (0.7999999999999999)
  const inexact: { d: string; fixed: string }[] = [
    { d: 'M0.1 0.2 l0.7 0.3 l1 1', fixed: 'M0.1 0.2 l0.7 0.3 L0.1 0.2Z' },
    { d: 'M0.1 0.2 l0.7 0.3 c1 0 1 1 2 2', fixed: `M0.1 0.2 l0.7 0.3 C${p + 1} 0.5 ${p + 1} 1.5 0.1 0.2Z` },
    { d: 'M0.1 0.2 l0.7 0.3 q1 1 2 2', fixed: `M0.1 0.2 l0.7 0.3 Q${p + 1} 1.5 0.1 0.2Z` },
    // T after l: its control point is the current point (SVG 2 Paths, T command).
    { d: 'M0.1 0.2 l0.7 0.3 t1 1', fixed: `M0.1 0.2 l0.7 0.3 Q${p} 0.5 0.1 0.2Z` },
    // S after c: first control point = 2·current − previous second control point (p, 1.2).
    { d: 'M0.1 0.2 c0 1 0.7 1 0.7 0.3 s1 1 2 2', fixed: `M0.1 0.2 c0 1 0.7 1 0.7 0.3 C${2 * p - p} ${2 * 0.5 - 1.2} ${p + 1} 1.5 0.1 0.2Z` },
    { d: 'M0.1 0.2 l0.7 0.3 a1 1 0 0 1 2 0', fixed: 'M0.1 0.2 l0.7 0.3 A1 1 0 0 1 0.1 0.2Z' },
    { d: 'M0.1 0.2 l0.7 0.3 h1', fixed: 'M0.1 0.2 l0.7 0.3 L0.1 0.2Z' },
  ];
  it.each(inexact)('writes an absolute command when relative numbers cannot be exact: $d', ({ d, fixed }) => {
    expect(0.1 + 0.7 + (0.1 - (0.1 + 0.7))).not.toBe(0.1);
    expect(checkCloseFix(d, 0).fixed).toBe(fixed);
  });

  it('offers no fix for closed subpaths or lone movetos', () => {
    const r = parsePathData('M0 0 L1 1 Z M5 5', 0);
    expect(r.subpaths.map((s) => s.closeFix)).toEqual([undefined, undefined]);
  });

  it('closes a subpath cut short by an error and leaves the error in place', () => {
    const d = 'M 10,10 L 20,20 0,0 5,5,30';
    const { fixed } = checkCloseFix(d, 0);
    expect(fixed).toBe('M 10,10 L 20,20 0,0 10 10Z,30');
    expect(parsePathData(fixed, 0).error).toBeDefined();
  });
});
