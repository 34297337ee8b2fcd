/**
 * Chaining: joins loose open pieces (lines, arcs, open polylines, splines) end to end into contours.
 *
 * Ends closer than a tolerance are clustered: a hash grid of square cells of side tolerance, each cell
 * compared with itself and its adjacent cells, union–find over the hits. Expected O(n) for n ends
 * (ends at exactly one point are tested once); only many distinct ends crowded into a few adjacent
 * cells cost more (the pairs between them). A cluster of exactly two ends joins two pieces (or closes one
 * piece on itself); a cluster of three or more ends is a branch point: it is reported, its first two
 * ends (in file order) are joined and the others stay free ends. Pieces are then walked from end to
 * end, reversing those that run the other way. Pieces join only within the same group (a DXF layer).
 */
import type { Segment } from '../types';

/** The open pieces to chain, as flat numbers (a million pieces make no million objects). */
export interface ChainInput {
  /** Start x, start y, end x, end y of each piece, in its own drawing direction. */
  readonly ends: Float64Array;
  /** The group of each piece: pieces join only with pieces of the same group. */
  readonly groups: readonly string[];
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

/** Column and row steps to the 4 adjacent cells that come after a cell in (column, row) order. */
const NEIGHBOUR_STEPS = [0, 1, 1, -1, 1, 0, 1, 1];

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

/** Joins pieces whose ends lie within `tolerance` (> 0, same unit as the coordinates) of each other. */
export function chainPieces(input: ChainInput, tolerance: number): ChainResult {
  const n = input.groups.length;
  if (n === 0) return { chains: [], branches: [] };
  const endCount = 2 * n;
  const ex = new Float64Array(endCount);
  const ey = new Float64Array(endCount);
  for (let e = 0; e < endCount; e++) {
    ex[e] = input.ends[2 * e];
    ey[e] = input.ends[2 * e + 1];
  }
  const parent = new Int32Array(endCount);
  for (let e = 0; e < endCount; e++) parent[e] = e;
  const union = (a: number, b: number) => {
    const ra = findRoot(parent, a), rb = findRoot(parent, b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  const groupIds = new Map<string, number>();
  const group = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const g = input.groups[i];
    let id = groupIds.get(g);
    if (id === undefined) groupIds.set(g, (id = groupIds.size));
    group[i] = id;
  }

  // Hash grid of ends (open addressing): a slot holds the first end of its cell, whose column, row and
  // group identify the cell. Cells have the tolerance as side, so ends within the tolerance lie in the
  // same or an adjacent cell.
  const col = new Float64Array(endCount);
  const row = new Float64Array(endCount);
  for (let e = 0; e < endCount; e++) {
    col[e] = Math.floor(ex[e] / tolerance);
    row[e] = Math.floor(ey[e] / tolerance);
  }
  let capacity = 16;
  while (capacity < 1.5 * endCount) capacity *= 2;
  const mask = capacity - 1;
  const slots = new Int32Array(capacity).fill(-1);
  const nextInCell = new Int32Array(endCount).fill(-1);
  const usedSlots: number[] = [];
  /** The slot of a cell, or −1 − (the free slot where it would go). */
  const findCell = (cx: number, cy: number, g: number): number => {
    // Mix all bits into the low ones the mask keeps (murmur3's finaliser): lattice-aligned ends would crowd a few slots.
    let h = Math.imul(cx | 0, 0x9e3779b1) ^ Math.imul(cy | 0, 0x85ebca77) ^ Math.imul(g, 0xc2b2ae3d);
    h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
    h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
    h = (h ^ (h >>> 16)) & mask;
    for (let first = slots[h]; first >= 0; first = slots[h]) {
      if (col[first] === cx && row[first] === cy && group[first >> 1] === g) return h;
      h = (h + 1) & mask;
    }
    return -1 - h;
  };
  const tol2 = tolerance * tolerance;
  for (let e = 0; e < endCount; e++) {
    const x = ex[e], y = ey[e];
    const slot = findCell(col[e], row[e], group[e >> 1]);
    if (slot < 0) {
      slots[-1 - slot] = e;
      usedSlots.push(-1 - slot);
      continue;
    }
    let twin = -1;
    for (let p = slots[slot]; p >= 0; p = nextInCell[p]) {
      if (ex[p] === x && ey[p] === y) { twin = p; break; }
    }
    if (twin >= 0) {
      // An end at exactly the same point joins everything its twin joins: it needs no tests of its own,
      // which keeps thousands of ends at one point linear.
      union(e, twin);
    } else {
      nextInCell[e] = slots[slot];
      slots[slot] = e;
    }
  }
  // Pairs within one cell, then with the 4 adjacent cells that come after it in (column, row) order.
  for (const a of usedSlots) {
    const head = slots[a];
    const cx = col[head], cy = row[head], g = group[head >> 1];
    for (let p = slots[a]; p >= 0; p = nextInCell[p]) {
      for (let q = nextInCell[p]; q >= 0; q = nextInCell[q]) {
        const dx = ex[q] - ex[p], dy = ey[q] - ey[p];
        if (dx * dx + dy * dy <= tol2) union(p, q);
      }
    }
    for (let k = 0; k < NEIGHBOUR_STEPS.length; k += 2) {
      const b = findCell(cx + NEIGHBOUR_STEPS[k], cy + NEIGHBOUR_STEPS[k + 1], g);
      if (b < 0) continue;
      for (let p = slots[a]; p >= 0; p = nextInCell[p]) {
        for (let q = slots[b]; q >= 0; q = nextInCell[q]) {
          const dx = ex[q] - ex[p], dy = ey[q] - ey[p];
          if (dx * dx + dy * dy <= tol2) union(p, q);
        }
      }
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
