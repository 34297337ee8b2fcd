/**
 * Chaining: joins loose open pieces (lines, arcs, open polylines, splines) end to end into contours.
 *
 * Ends closer than a tolerance are clustered (a flatbush index over all ends, one box query per end,
 * union–find over the hits: O(n log n)). A cluster of exactly two ends joins two pieces (or closes one
 * piece on itself); a cluster of three or more ends is a branch point: it is reported, its first two
 * ends (in file order) are joined and the others stay free ends. Pieces are then walked from end to
 * end, reversing those that run the other way. Pieces join only within the same group (a DXF layer).
 */
import Flatbush from 'flatbush';
import type { Segment } from '../types';

/** The two ends of one open piece, in its own drawing direction. */
export interface ChainPiece {
  readonly x0: number; readonly y0: number;
  readonly x1: number; readonly y1: number;
  /** Pieces join only with pieces of the same group. */
  readonly group: string;
}

export interface ChainLink {
  /** Index into the input pieces. */
  readonly piece: number;
  /** True when the piece is walked from its end to its start. */
  readonly reversed: boolean;
}

export interface Chain {
  /** Pieces in walking order; the first piece keeps its own direction when the chain is closed. */
  readonly links: readonly ChainLink[];
  /** True when the last end joins the first start. */
  readonly closed: boolean;
}

/** Three or more piece ends within the tolerance of one another. */
export interface BranchPoint {
  readonly x: number; readonly y: number;
  /** The pieces whose ends meet there, ascending, each once. */
  readonly pieces: readonly number[];
}

export interface ChainResult {
  /** Every input piece appears in exactly one chain; chains are ordered by their lowest piece index. */
  readonly chains: readonly Chain[];
  readonly branches: readonly BranchPoint[];
}

function findRoot(parent: Int32Array, i: number): number {
  let r = i;
  while (parent[r] !== r) r = parent[r];
  while (parent[i] !== r) {
    const next = parent[i];
    parent[i] = r;
    i = next;
  }
  return r;
}

/** Joins pieces whose ends lie within `tolerance` (same unit as the coordinates) of each other. */
export function chainPieces(pieces: readonly ChainPiece[], tolerance: number): ChainResult {
  const n = pieces.length;
  if (n === 0) return { chains: [], branches: [] };
  const endCount = 2 * n;
  const ex = new Float64Array(endCount);
  const ey = new Float64Array(endCount);
  for (let i = 0; i < n; i++) {
    const p = pieces[i];
    ex[2 * i] = p.x0; ey[2 * i] = p.y0;
    ex[2 * i + 1] = p.x1; ey[2 * i + 1] = p.y1;
  }
  const index = new Flatbush(endCount);
  for (let e = 0; e < endCount; e++) index.add(ex[e], ey[e], ex[e], ey[e]);
  index.finish();

  // Union–find over ends within the tolerance (Euclidean distance, same group).
  const parent = new Int32Array(endCount);
  for (let e = 0; e < endCount; e++) parent[e] = e;
  const tol2 = tolerance * tolerance;
  for (let e = 0; e < endCount; e++) {
    const x = ex[e], y = ey[e];
    const group = pieces[e >> 1].group;
    const hits = index.search(x - tolerance, y - tolerance, x + tolerance, y + tolerance);
    for (const h of hits) {
      if (h <= e) continue;
      const dx = ex[h] - x, dy = ey[h] - y;
      if (dx * dx + dy * dy > tol2 || pieces[h >> 1].group !== group) continue;
      const ra = findRoot(parent, e), rb = findRoot(parent, h);
      if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
    }
  }

  // Clusters, each listing its ends ascending (ends are visited in order).
  const partner = new Int32Array(endCount).fill(-1);
  const clusterSize = new Int32Array(endCount);
  for (let e = 0; e < endCount; e++) clusterSize[findRoot(parent, e)]++;
  const members = new Map<number, number[]>();
  for (let e = 0; e < endCount; e++) {
    const r = findRoot(parent, e);
    if (clusterSize[r] < 2) continue;
    if (clusterSize[r] === 2) {
      if (r !== e) { partner[r] = e; partner[e] = r; }
      continue;
    }
    let list = members.get(r);
    if (!list) members.set(r, (list = []));
    list.push(e);
  }
  const branches: BranchPoint[] = [];
  for (const list of members.values()) {
    partner[list[0]] = list[1];
    partner[list[1]] = list[0];
    const set = [...new Set(list.map((e) => e >> 1))].sort((a, b) => a - b);
    branches.push({ x: ex[list[0]], y: ey[list[0]], pieces: set });
  }
  branches.sort((a, b) => a.pieces[0] - b.pieces[0]);

  // Walk: from the lowest unvisited piece go backwards to a free end (or all the way round), then forwards.
  const visited = new Uint8Array(n);
  const chains: Chain[] = [];
  for (let first = 0; first < n; first++) {
    if (visited[first]) continue;
    // Backwards from the start end of `first` (end index 2*first).
    let startEnd = 2 * first; // the end where the chain currently starts
    let closed = false;
    for (;;) {
      const q = partner[startEnd];
      if (q < 0) break;
      const piece = q >> 1;
      if (piece === first) { closed = true; break; }
      // The neighbour is entered at its end q, so the chain now starts at its other end.
      startEnd = q ^ 1;
    }
    const links: ChainLink[] = [];
    // A closed chain starts at `first`, in its own direction; an open one at the free end found above.
    let end = closed ? 2 * first : startEnd;
    for (;;) {
      const piece = end >> 1;
      if (visited[piece]) break;
      visited[piece] = 1;
      const reversed = (end & 1) === 1;
      links.push({ piece, reversed });
      const out = end ^ 1;
      const q = partner[out];
      if (q < 0) break;
      end = q;
    }
    chains.push({ links, closed });
  }
  return { chains, branches };
}

/** The same curve walked the other way (an arc: swap ends, θ0' = θ0 + sweep, sweep' = −sweep). */
export function reverseSegment(s: Segment): Segment {
  switch (s.kind) {
    case 'line':
      return { kind: 'line', x0: s.x1, y0: s.y1, x1: s.x0, y1: s.y0, span: s.span };
    case 'quad':
      return { kind: 'quad', x0: s.x2, y0: s.y2, x1: s.x1, y1: s.y1, x2: s.x0, y2: s.y0, span: s.span };
    case 'cubic':
      return { kind: 'cubic', x0: s.x3, y0: s.y3, x1: s.x2, y1: s.y2, x2: s.x1, y2: s.y1, x3: s.x0, y3: s.y0, span: s.span };
    case 'arc':
      return { ...s, x0: s.x1, y0: s.y1, x1: s.x0, y1: s.y0, theta0: s.theta0 + s.sweep, sweep: -s.sweep };
  }
}

/** A list of segments walked the other way. */
export function reverseSegments(segments: readonly Segment[]): Segment[] {
  const out: Segment[] = new Array<Segment>(segments.length);
  for (let i = 0; i < segments.length; i++) out[segments.length - 1 - i] = reverseSegment(segments[i]);
  return out;
}
