/**
 * Broad phase of the intersection search: every pair of monotone pieces whose boxes meet, found by
 * joining one packed box tree with itself, so there is no query per piece.
 *
 * Leaves are runs of consecutive pieces of one chain (neighbours on a contour lie next to each other,
 * so a run's box is small). A monotone leaf holds up to MONOTONE_LEAF_PIECES pieces whose boxes move
 * one way along each axis: lower and upper x of the boxes both ascend (or both descend) along the
 * run, and likewise y. Smooth outlines are made of such runs (a wavy circle of a million lines, of
 * about a dozen). The pieces of a monotone leaf that meet a given box then form one contiguous range
 * of the run, found by four pointers that only move forward while the querying pieces move along a
 * run of their own, so a pair of monotone leaves costs the length of both plus the pairs found, and
 * a monotone leaf with itself the length plus the pairs. The rest goes to plain leaves of up to
 * LEAF_PIECES pieces, whose pairs are tested one by one. Leaves are put in Z-order of their box
 * centres (Morton code, 16 bits per axis, sorted by an LSD radix sort of four 8-bit digits) and
 * packed FANOUT to a node, level by level, as in a packed R-tree. The join descends only into pairs of
 * nodes whose boxes meet; a node's box is the union of its children's, so no meeting pair is missed.
 * For contours drawn at a bounded density the cost is ~ n log n + k for n pieces and k meeting pairs.
 * [src: packed R-tree and its spatial join: Roussopoulos & Leifker 1985 (packing), Brinkhoff, Kriegel
 * & Seeger 1993 (R-tree join) — from memory; Z-order: Morton 1966; monotone chains in intersection
 * searches: de Berg et al., Computational Geometry, 3rd ed., §3.2 (y-monotone pieces) — from memory]
 */
import { STRIDE, type Pieces } from './intersectPieces';

/** Most consecutive pieces of one chain in a plain leaf. [common practice, no source; 8 measured fastest of 4–32] */
const LEAF_PIECES = 8;
/** Most pieces in a monotone leaf. [common practice, no source; measured on the geometry bench] */
const MONOTONE_LEAF_PIECES = 64;
/** A monotone run of at least this many pieces becomes a monotone leaf; shorter ones go to plain leaves. */
const MONOTONE_RUN_MIN = 2 * LEAF_PIECES;
/** Children per inner node. [common practice, no source; flatbush's default node size is 16] */
const FANOUT = 16;
/** Up to this many pieces every pair is tested directly: building the tree would cost more (measured on the samples). */
const DIRECT_PIECES = 96;
/** Leaf pairs visited between two polls of `isCancelled`. */
const POLL_EVERY = 4096;

/** Bits per axis in the Z-order code, so that the code fits a 32-bit unsigned integer. */
const MORTON_BITS = 16;

/** Spreads the low 16 bits of v to the even bit positions (bit k → bit 2k). */
function spreadBits(v: number): number {
  v = (v | (v << 8)) & 0x00ff00ff;
  v = (v | (v << 4)) & 0x0f0f0f0f;
  v = (v | (v << 2)) & 0x33333333;
  v = (v | (v << 1)) & 0x55555555;
  return v;
}

/** Indices 0..codes.length−1 ordered by codes (unsigned 32-bit), stable: LSD radix sort, four 8-bit digits. */
export function sortByCode(codes: Uint32Array): Int32Array {
  const n = codes.length;
  let from = new Int32Array(n);
  let to = new Int32Array(n);
  for (let k = 0; k < n; k++) from[k] = k;
  const counts = new Int32Array(256);
  for (let shift = 0; shift < 32; shift += 8) {
    counts.fill(0);
    for (let k = 0; k < n; k++) counts[(codes[k]! >>> shift) & 0xff]!++;
    let sum = 0;
    for (let d = 0; d < counts.length; d++) {
      const c = counts[d]!;
      counts[d] = sum;
      sum += c;
    }
    for (let k = 0; k < n; k++) {
      const idx = from[k]!;
      to[counts[(codes[idx]! >>> shift) & 0xff]!++] = idx;
    }
    [from, to] = [to, from];
  }
  return from;
}

/**
 * Boxes of pieces [from, to) grown by `pad`, [minX, minY, maxX, maxY] each, written into `box` from
 * its start (a piece is monotone, so its box is the box of its end points).
 */
function writePieceBoxes(buf: Float64Array, pad: number, from: number, to: number, box: Float64Array): void {
  for (let i = from, k = 0; i < to; i++, k += 4) {
    const o = i * STRIDE;
    box[k] = Math.min(buf[o + 4]!, buf[o + 6]!) - pad;
    box[k + 1] = Math.min(buf[o + 5]!, buf[o + 7]!) - pad;
    box[k + 2] = Math.max(buf[o + 4]!, buf[o + 6]!) + pad;
    box[k + 3] = Math.max(buf[o + 5]!, buf[o + 7]!) + pad;
  }
}

/**
 * The boxes of a monotone leaf's pieces [from, to), as writePieceBoxes, with each axis that descends
 * along the leaf (`kind`: 1 x, 2 y) negated, its lower and upper bound swapped: then both bounds
 * ascend along the leaf on both axes. Negation is exact, and two boxes meet after it exactly when
 * they met before.
 */
function writeAscendingBoxes(buf: Float64Array, pad: number, from: number, to: number, kind: number, box: Float64Array): void {
  writePieceBoxes(buf, pad, from, to, box);
  const m = 4 * (to - from);
  if ((kind & 1) !== 0) {
    for (let k = 0; k < m; k += 4) {
      const lo = box[k]!;
      box[k] = -box[k + 2]!;
      box[k + 2] = -lo;
    }
  }
  if ((kind & 2) !== 0) {
    for (let k = 1; k < m; k += 4) {
      const lo = box[k]!;
      box[k] = -box[k + 2]!;
      box[k + 2] = -lo;
    }
  }
}

/**
 * How the interval [b0, b1] follows [a0, a1]: 0 equal, 1 neither end lower, −1 neither end higher,
 * 2 one end each way (or a NaN, with which every comparison is false).
 */
function getStep(a0: number, a1: number, b0: number, b1: number): number {
  if (b0 === a0 && b1 === a1) return 0;
  if (b0 >= a0 && b1 >= a1) return 1;
  if (b0 <= a0 && b1 <= a1) return -1;
  return 2;
}

/**
 * The monotone run of pieces from `s` (at most MONOTONE_LEAF_PIECES, not past `end`): each piece's
 * box follows the one before one way along x for the whole run, and one way along y (an equal box
 * fits either way). Returns 4 × its length, plus 1 when x descends along it and 2 when y does.
 */
function getMonotoneRun(buf: Float64Array, s: number, end: number): number {
  const last = Math.min(end, s + MONOTONE_LEAF_PIECES);
  let o = s * STRIDE;
  let x0 = Math.min(buf[o + 4]!, buf[o + 6]!), x1 = Math.max(buf[o + 4]!, buf[o + 6]!);
  let y0 = Math.min(buf[o + 5]!, buf[o + 7]!), y1 = Math.max(buf[o + 5]!, buf[o + 7]!);
  let dx = 0, dy = 0; // 1 ascending, −1 descending, 0 not known yet
  let i = s + 1;
  for (; i < last; i++) {
    o = i * STRIDE;
    const a0 = Math.min(buf[o + 4]!, buf[o + 6]!), a1 = Math.max(buf[o + 4]!, buf[o + 6]!);
    const b0 = Math.min(buf[o + 5]!, buf[o + 7]!), b1 = Math.max(buf[o + 5]!, buf[o + 7]!);
    const sx = getStep(x0, x1, a0, a1), sy = getStep(y0, y1, b0, b1);
    if (sx === 2 || sy === 2 || sx * dx < 0 || sy * dy < 0) break;
    if (sx !== 0) dx = sx;
    if (sy !== 0) dy = sy;
    x0 = a0; x1 = a1; y0 = b0; y1 = b1;
  }
  return 4 * (i - s) + (dx < 0 ? 1 : 0) + (dy < 0 ? 2 : 0);
}

/** How findPiecePairs may stop before it has found every pair. */
export interface PiecePairLimits {
  /** Polled during the search; once it returns true the search stops. */
  readonly isCancelled?: (() => boolean) | undefined;
  /**
   * The search stops soon after it has found more than this many pairs (within the two leaves it is
   * joining), so more than `maxPairs` pairs returned means there may be others.
   */
  readonly maxPairs?: number;
}

/** findPiecePairs for a few pieces: every pair, in order. */
function findPairsDirectly(P: Pieces, pad: number, keep: (i: number, j: number) => boolean, maxPairs: number): Int32Array {
  const n = P.count;
  const box = new Float64Array(4 * n);
  writePieceBoxes(P.buf, pad, 0, n, box);
  const pairs: number[] = [];
  for (let i = 0; i < n && pairs.length <= 2 * maxPairs; i++) {
    for (let j = i + 1; j < n; j++) {
      if (box[4 * i + 2]! < box[4 * j]! || box[4 * i + 3]! < box[4 * j + 1]! || box[4 * i]! > box[4 * j + 2]! || box[4 * i + 1]! > box[4 * j + 3]!) continue;
      if (keep(i, j)) pairs.push(i, j);
    }
  }
  return Int32Array.from(pairs);
}

/**
 * All pairs i < j of pieces whose boxes, each grown by `pad` on every side, meet (closed boxes) and
 * that `keep(i, j)` accepts, as [i0, j0, i1, j1, …] sorted by i then j. When `limits.isCancelled`
 * returns true, or more than `limits.maxPairs` pairs are found, the search stops and the pairs found
 * so far are returned.
 */
export function findPiecePairs(
  P: Pieces, pad: number, keep: (i: number, j: number) => boolean, { isCancelled, maxPairs = Infinity }: PiecePairLimits = {},
): Int32Array {
  const n = P.count;
  const buf = P.buf;
  if (n <= DIRECT_PIECES) return findPairsDirectly(P, pad, keep, maxPairs);
  // Leaves: runs of consecutive pieces within one chain, monotone ones (kind 4 + the descending axes)
  // where a long run allows, plain ones (kind 0) of LEAF_PIECES otherwise. A monotone leaf has at
  // least as many pieces as a plain one, so there are at most as many leaves as plain ones alone.
  let capacity = 0;
  for (let c = 0; c < P.chains.length; c++) capacity += Math.ceil(P.chains[c]!.count / LEAF_PIECES);
  const leafFirst = new Int32Array(capacity);
  const leafEnd = new Int32Array(capacity);
  const leafKind = new Uint8Array(capacity);
  const leafBox = new Float64Array(4 * capacity);
  let allMinX = Infinity, allMinY = Infinity, allMaxX = -Infinity, allMaxY = -Infinity;
  let leaves = 0;
  for (let c = 0; c < P.chains.length; c++) {
    const first = P.chains[c]!.first, end = first + P.chains[c]!.count;
    for (let s = first; s < end;) {
      const run = getMonotoneRun(buf, s, end);
      const monotone = run >> 2 >= MONOTONE_RUN_MIN;
      const e = monotone ? s + (run >> 2) : Math.min(s + LEAF_PIECES, end);
      // A monotone leaf's box is that of its two end pieces' boxes (each bound is sorted along it).
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (let i = s; i < e; i = monotone && i === s ? e - 1 : i + 1) {
        const o = i * STRIDE;
        minX = Math.min(minX, Math.min(buf[o + 4]!, buf[o + 6]!) - pad);
        minY = Math.min(minY, Math.min(buf[o + 5]!, buf[o + 7]!) - pad);
        maxX = Math.max(maxX, Math.max(buf[o + 4]!, buf[o + 6]!) + pad);
        maxY = Math.max(maxY, Math.max(buf[o + 5]!, buf[o + 7]!) + pad);
      }
      leafFirst[leaves] = s;
      leafEnd[leaves] = e;
      leafKind[leaves] = monotone ? 4 | (run & 3) : 0;
      leafBox[4 * leaves] = minX; leafBox[4 * leaves + 1] = minY; leafBox[4 * leaves + 2] = maxX; leafBox[4 * leaves + 3] = maxY;
      allMinX = Math.min(allMinX, minX); allMinY = Math.min(allMinY, minY);
      allMaxX = Math.max(allMaxX, maxX); allMaxY = Math.max(allMaxY, maxY);
      leaves++;
      s = e;
    }
  }

  // Z-order of the leaf centres.
  const cells = (1 << MORTON_BITS) - 1;
  const sx = allMaxX > allMinX ? cells / (allMaxX - allMinX) : 0;
  const sy = allMaxY > allMinY ? cells / (allMaxY - allMinY) : 0;
  const codes = new Uint32Array(leaves);
  for (let g = 0; g < leaves; g++) {
    const cx = Math.floor(sx * (0.5 * (leafBox[4 * g]! + leafBox[4 * g + 2]!) - allMinX)) || 0;
    const cy = Math.floor(sy * (0.5 * (leafBox[4 * g + 1]! + leafBox[4 * g + 3]!) - allMinY)) || 0;
    codes[g] = (spreadBits(Math.min(Math.max(cx, 0), cells)) | (spreadBits(Math.min(Math.max(cy, 0), cells)) << 1)) >>> 0;
  }
  const order = sortByCode(codes);

  // Levels: level 0 holds the leaves in Z-order, level l + 1 packs FANOUT nodes of level l per node.
  const levelBoxes: Float64Array[] = [new Float64Array(4 * leaves)];
  for (let k = 0; k < leaves; k++) {
    for (let d = 0; d < 4; d++) levelBoxes[0]![4 * k + d] = leafBox[4 * order[k]! + d]!;
  }
  while (levelBoxes[levelBoxes.length - 1]!.length > 4) {
    const below = levelBoxes[levelBoxes.length - 1]!;
    const m = below.length / 4;
    const up = new Float64Array(4 * Math.ceil(m / FANOUT));
    for (let p = 0; p < up.length / 4; p++) {
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (let c = p * FANOUT; c < Math.min(m, (p + 1) * FANOUT); c++) {
        minX = Math.min(minX, below[4 * c]!);
        minY = Math.min(minY, below[4 * c + 1]!);
        maxX = Math.max(maxX, below[4 * c + 2]!);
        maxY = Math.max(maxY, below[4 * c + 3]!);
      }
      up[4 * p] = minX; up[4 * p + 1] = minY; up[4 * p + 2] = maxX; up[4 * p + 3] = maxY;
    }
    levelBoxes.push(up);
  }

  // Accepted pairs as keys i·n + j (exact: n² < 2^53 for any piece buffer that fits in memory).
  let keys = new Float64Array(64);
  let found = 0;
  let stopped = false;
  const push = (i: number, j: number) => {
    if (!keep(i, j)) return;
    if (found === keys.length) {
      const grown = new Float64Array(2 * keys.length);
      grown.set(keys);
      keys = grown;
    }
    keys[found++] = i * n + j;
    if (found > maxPairs) stopped = true;
  };
  /** Closed boxes a (in A) and b (in B) meet; written as flatbush's rejection test, negated. */
  const meet = (A: Float64Array, a: number, B: Float64Array, b: number) =>
    !(A[4 * a + 2]! < B[4 * b]! || A[4 * a + 3]! < B[4 * b + 1]! || A[4 * a]! > B[4 * b + 2]! || A[4 * a + 1]! > B[4 * b + 3]!);

  let visits = 0;
  const poll = () => {
    if ((++visits % POLL_EVERY) === 0 && isCancelled?.()) stopped = true;
  };
  // Piece boxes of the leaves being joined, written from the piece buffer when a leaf is visited:
  // the join visits a leaf's pairs with its neighbours one after the other, so the boxes of leaf
  // `boxesOfA` are kept for as long as it stays the first of the pair, the ascending boxes of
  // `ascendingOf` (a monotone leaf's, writeAscendingBoxes) likewise, and the other leaf's are
  // written only when one of the first leaf's pieces meets its box.
  const boxA = new Float64Array(4 * MONOTONE_LEAF_PIECES), boxB = new Float64Array(4 * MONOTONE_LEAF_PIECES);
  const ascending = new Float64Array(4 * MONOTONE_LEAF_PIECES);
  let boxesOfA = -1, ascendingOf = -1;
  const loadA = (g: number) => {
    if (boxesOfA === g) return;
    writePieceBoxes(buf, pad, leafFirst[g]!, leafEnd[g]!, boxA);
    boxesOfA = g;
  };
  const loadAscending = (g: number) => {
    if (ascendingOf === g) return;
    writeAscendingBoxes(buf, pad, leafFirst[g]!, leafEnd[g]!, leafKind[g]!, ascending);
    ascendingOf = g;
  };
  const leafSelf = (g: number) => {
    poll();
    const s = leafFirst[g]!, m = leafEnd[g]! - s;
    if (leafKind[g] === 0) {
      loadA(g);
      for (let a = 0; a < m; a++) {
        for (let b = a + 1; b < m; b++) if (meet(boxA, a, boxA, b)) push(s + a, s + b);
      }
      return;
    }
    // Along a monotone leaf, a later piece's lower bounds only grow, so once one of them passes
    // piece a's upper bound, no later piece meets a.
    loadAscending(g);
    const box = ascending;
    for (let a = 0; a < m; a++) {
      const x1 = box[4 * a + 2]!, y1 = box[4 * a + 3]!;
      for (let b = a + 1; b < m && box[4 * b]! <= x1 && box[4 * b + 1]! <= y1; b++) push(s + a, s + b);
    }
  };
  /** Pairs of the pieces of leaf q (boxes in `box`) with those of the monotone leaf t. */
  const searchMonotone = (q: number, box: Float64Array, t: number) => {
    const qs = leafFirst[q]!, qm = leafEnd[q]! - qs, ts = leafFirst[t]!, tm = leafEnd[t]! - ts, kind = leafKind[t]!;
    const tMinX = leafBox[4 * t]!, tMinY = leafBox[4 * t + 1]!, tMaxX = leafBox[4 * t + 2]!, tMaxY = leafBox[4 * t + 3]!;
    const asc = ascending;
    // The pieces of t meeting a box are those from the first whose upper bounds reach its lower ones
    // (lx, ly) to before the first whose lower bounds pass its upper ones (hx, hy), on both axes.
    let lx = 0, hx = 0, ly = 0, hy = 0;
    for (let a = 0; a < qm; a++) {
      const x0 = box[4 * a]!, y0 = box[4 * a + 1]!, x1 = box[4 * a + 2]!, y1 = box[4 * a + 3]!;
      if (x1 < tMinX || y1 < tMinY || x0 > tMaxX || y0 > tMaxY) continue;
      loadAscending(t);
      // A NaN bound (a piece's box has both or neither) rules nothing out on its axis.
      const nanX = x0 !== x0, nanY = y0 !== y0;
      if (!nanX) {
        const ax0 = (kind & 1) !== 0 ? -x1 : x0, ax1 = (kind & 1) !== 0 ? -x0 : x1;
        while (lx > 0 && asc[4 * lx - 2]! >= ax0) lx--;
        while (lx < tm && asc[4 * lx + 2]! < ax0) lx++;
        while (hx > 0 && asc[4 * hx - 4]! > ax1) hx--;
        while (hx < tm && asc[4 * hx]! <= ax1) hx++;
      }
      if (!nanY) {
        const ay0 = (kind & 2) !== 0 ? -y1 : y0, ay1 = (kind & 2) !== 0 ? -y0 : y1;
        while (ly > 0 && asc[4 * ly - 1]! >= ay0) ly--;
        while (ly < tm && asc[4 * ly + 3]! < ay0) ly++;
        while (hy > 0 && asc[4 * hy - 3]! > ay1) hy--;
        while (hy < tm && asc[4 * hy + 1]! <= ay1) hy++;
      }
      const lo = Math.max(nanX ? 0 : lx, nanY ? 0 : ly), hi = Math.min(nanX ? tm : hx, nanY ? tm : hy);
      for (let b = lo; b < hi; b++) push(Math.min(qs + a, ts + b), Math.max(qs + a, ts + b));
    }
  };
  const leafPair = (g: number, h: number) => {
    poll();
    if (leafKind[h] !== 0) {
      loadA(g);
      searchMonotone(g, boxA, h);
      return;
    }
    const hs = leafFirst[h]!, hm = leafEnd[h]! - hs;
    if (leafKind[g] !== 0) {
      writePieceBoxes(buf, pad, hs, hs + hm, boxB);
      searchMonotone(h, boxB, g);
      return;
    }
    loadA(g);
    const gs = leafFirst[g]!, gm = leafEnd[g]! - gs;
    let loadedB = false;
    for (let a = 0; a < gm; a++) {
      if (!meet(boxA, a, leafBox, h)) continue;
      if (!loadedB) {
        writePieceBoxes(buf, pad, hs, hs + hm, boxB);
        loadedB = true;
      }
      for (let b = 0; b < hm; b++) if (meet(boxA, a, boxB, b)) push(Math.min(gs + a, hs + b), Math.max(gs + a, hs + b));
    }
  };
  const joinPair = (level: number, a: number, b: number): void => {
    if (stopped) return;
    if (level === 0) {
      leafPair(order[a]!, order[b]!);
      return;
    }
    const below = levelBoxes[level - 1]!, here = levelBoxes[level]!;
    const a1 = Math.min((a + 1) * FANOUT, below.length / 4), b0 = b * FANOUT, b1 = Math.min(b0 + FANOUT, below.length / 4);
    for (let x = a * FANOUT; x < a1; x++) {
      if (!meet(below, x, here, b)) continue;
      for (let y = b0; y < b1; y++) if (meet(below, x, below, y)) joinPair(level - 1, x, y);
    }
  };
  const joinSelf = (level: number, a: number): void => {
    if (stopped) return;
    if (level === 0) {
      leafSelf(order[a]!);
      return;
    }
    const below = levelBoxes[level - 1]!;
    const c1 = Math.min((a + 1) * FANOUT, below.length / 4);
    for (let x = a * FANOUT; x < c1; x++) {
      joinSelf(level - 1, x);
      for (let y = x + 1; y < c1; y++) if (meet(below, x, below, y)) joinPair(level - 1, x, y);
    }
  };
  if (leaves > 0) joinSelf(levelBoxes.length - 1, 0);

  const sorted = keys.subarray(0, found).sort();
  const pairs = new Int32Array(2 * found);
  for (let k = 0; k < found; k++) {
    const key = sorted[k]!;
    const j = key % n;
    pairs[2 * k] = (key - j) / n;
    pairs[2 * k + 1] = j;
  }
  return pairs;
}
