/**
 * Chaining: joins loose open pieces (lines, arcs, open polylines, splines) end to end into contours.
 *
 * Ends closer than a tolerance are clustered. Each end falls in a square cell of side tolerance (column
 * ⌊x / tolerance⌋, row ⌊y / tolerance⌋), so ends within the tolerance lie in the same or adjacent cells.
 * The ends are radix-sorted by (group, column, row), which puts each cell's ends side by side and the
 * cells in an order a sweep can follow: each cell is compared with itself, the next cell (row + 1) and
 * the three cells of the next column found by a moving cursor, and union–find joins the hits. Ends at
 * exactly one point are tested once, so the cost is O(n) for n ends but for many distinct ends crowded
 * into a few adjacent cells (the pairs between them). A cluster of exactly two ends joins two pieces (or
 * closes one piece on itself); a cluster of three or more ends is a branch point: it is reported, its
 * first two ends (in input order) are joined and the others stay free ends. Pieces are then walked from
 * end to end, reversing those that run the other way. Pieces join only within the same group (a DXF
 * layer). Everything is typed arrays: a million pieces make no million objects, and the sorted sweep
 * reads memory in order where a hash table of cells would miss the cache on every probe.
 */

/** The open pieces to chain, as flat numbers. */
export interface ChainInput {
  /** Start x, start y, end x, end y of each piece, in its own drawing direction. */
  readonly ends: Float64Array;
  /** The group of each piece (a small non-negative integer): pieces join only within one group. */
  readonly groups: Int32Array;
}

export interface ChainResult {
  /**
   * The chains' links, chain after chain, each the end by which the walk enters a piece: 2 × piece
   * (walked in its own direction) or 2 × piece + 1 (walked from its end to its start, reversed).
   */
  readonly links: Int32Array;
  /** Chain k is links[starts[k]] … links[starts[k + 1] − 1]; chains are ordered by their lowest piece index. */
  readonly starts: Int32Array;
  /** 1 when chain k's last end joins its first start; a closed chain starts at its lowest piece, in its own direction. */
  readonly closed: Uint8Array;
  readonly branches: readonly BranchPoint[];
}

/** Three or more piece ends within the tolerance of one another. */
export interface BranchPoint {
  readonly x: number; readonly y: number;
  /** The pieces whose ends meet there, ascending, each once. */
  readonly pieces: readonly number[];
}

/** Number of chains in a result. */
export function getChainCount(r: ChainResult): number {
  return r.starts.length - 1;
}

/** Bits per radix-sort digit: 2048 buckets, whose counters stay in the first-level cache. */
const DIGIT_BITS = 11;
const DIGIT_MASK = (1 << DIGIT_BITS) - 1;

/** Bit view of one double, for order-preserving sort keys. */
const KEY_NUMBER = new Float64Array(1);
const KEY_WORDS = new Uint32Array(KEY_NUMBER.buffer);

/**
 * Sorts records of `width` unsigned words by their first `keyWords.length` words (most significant
 * first), which are also given apart as `keyWords` (word v of record i is keyWords[v][i]), with a
 * stable least-significant-digit radix sort that moves whole records, so each pass reads in order and
 * writes one stream per digit value. Digits equal in every record are skipped: coordinates that vary
 * in few bits cost few passes. The digit counts do not depend on the records' order, so they are all
 * taken from the compact key words first, and each pass only moves records. Returns the sorted records
 * (`records` or a new array).
 */
function sortRecords(records: Uint32Array, width: number, keyWords: readonly Uint32Array[]): Uint32Array {
  const m = records.length / width;
  // The passes, least significant digit first: the word, the shift and where each digit value goes.
  const passes: { word: number; shift: number; next: Int32Array }[] = [];
  for (let w = keyWords.length - 1; w >= 0; w--) {
    const word = keyWords[w];
    let all = 0xffffffff, any = 0;
    for (let i = 0; i < m; i++) {
      all &= word[i];
      any |= word[i];
    }
    const varying = (all ^ any) >>> 0;
    for (let shift = 0; shift < 32; shift += DIGIT_BITS) {
      if (((varying >>> shift) & DIGIT_MASK) === 0) continue;
      const next = new Int32Array(1 << DIGIT_BITS);
      for (let i = 0; i < m; i++) next[(word[i] >>> shift) & DIGIT_MASK]++;
      let sum = 0;
      for (let d = 0; d <= DIGIT_MASK; d++) {
        const c = next[d];
        next[d] = sum;
        sum += c;
      }
      passes.push({ word: w, shift, next });
    }
  }
  let from: Uint32Array = records;
  let to: Uint32Array = new Uint32Array(passes.length > 0 ? records.length : 0);
  for (const { word, shift, next } of passes) {
    for (let i = 0; i < m; i++) {
      const at = width * i;
      const j = width * next[(from[at + word] >>> shift) & DIGIT_MASK]++;
      for (let v = 0; v < width; v++) to[j + v] = from[at + v];
    }
    const t = from;
    from = to;
    to = t;
  }
  return from;
}

/**
 * Sort key words of cell numbers (integers, ±Infinity; no NaN, no −0): one word per number, its offset
 * from the least, when all are finite and span less than 2³² (exact: the offsets of distinct doubles
 * so close are distinct integers); otherwise two, the IEEE bits with the sign flipped (and all bits
 * flipped for negatives), whose unsigned order is numeric order.
 */
function getKeyWords(values: Float64Array): Uint32Array[] {
  const m = values.length;
  let min = Infinity, max = -Infinity;
  for (let i = 0; i < m; i++) {
    const v = values[i];
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (max - min < 2 ** 32) {
    const word = new Uint32Array(m);
    for (let i = 0; i < m; i++) word[i] = values[i] - min;
    return [word];
  }
  const hi = new Uint32Array(m), lo = new Uint32Array(m);
  for (let i = 0; i < m; i++) {
    KEY_NUMBER[0] = values[i];
    const l = KEY_WORDS[0], h = KEY_WORDS[1];
    if (h >= 0x80000000) {
      hi[i] = ~h >>> 0;
      lo[i] = ~l >>> 0;
    } else {
      hi[i] = (h | 0x80000000) >>> 0;
      lo[i] = l;
    }
  }
  return [hi, lo];
}

/** True when not every word is the first. */
function varies(words: Uint32Array): boolean {
  const first = words[0];
  for (let i = 1; i < words.length; i++) if (words[i] !== first) return true;
  return false;
}

/** Joins pieces whose ends lie within `tolerance` (> 0, same unit as the coordinates) of each other. */
export function chainPieces(input: ChainInput, tolerance: number): ChainResult {
  const n = input.groups.length;
  const ends = input.ends;
  const endCount = 2 * n;

  // Cells of the ends. An end with a NaN coordinate is alone: it is left out of the sort.
  let m = 0;
  const valid = new Int32Array(endCount);
  for (let e = 0; e < endCount; e++) if (!Number.isNaN(ends[2 * e]) && !Number.isNaN(ends[2 * e + 1])) valid[m++] = e;
  const groups = new Uint32Array(m), cols = new Float64Array(m), rows = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const e = valid[k];
    groups[k] = input.groups[e >> 1];
    cols[k] = Math.floor(ends[2 * e] / tolerance) + 0;
    rows[k] = Math.floor(ends[2 * e + 1] / tolerance) + 0;
  }
  // Records: the key words that vary and the end; sorted by (group, column, row). The coordinates stay
  // out of the records (the sort moves 3 words an end, not 8) and are gathered once, in sorted order.
  const groupVaries = varies(groups);
  const keyWords = [groups, ...getKeyWords(cols), ...getKeyWords(rows)].filter(varies);
  const keyWidth = keyWords.length;
  const width = keyWidth + 1;
  let records: Uint32Array = new Uint32Array(m * width);
  for (let k = 0; k < m; k++) {
    for (let v = 0; v < keyWidth; v++) records[width * k + v] = keyWords[v][k];
    records[width * k + keyWidth] = valid[k];
  }
  records = sortRecords(records, width, keyWords);
  // Sorted position → end, and the ends' coordinates and groups in sorted order.
  const perm = new Int32Array(m);
  const sx = new Float64Array(m), sy = new Float64Array(m), sg = new Int32Array(m);
  for (let p = 0; p < m; p++) {
    const e = records[width * p + keyWidth];
    perm[p] = e;
    sx[p] = ends[2 * e];
    sy[p] = ends[2 * e + 1];
    sg[p] = groupVaries ? records[width * p] : groups[0];
  }

  // The cells: runs of equal (group, column, row).
  const cellStart = new Int32Array(m + 1);
  const cellGroup = new Int32Array(m);
  const cellCol = new Float64Array(m), cellRow = new Float64Array(m);
  let cellCount = 0;
  for (let p = 0; p < m; p++) {
    const g = sg[p], c = Math.floor(sx[p] / tolerance) + 0, r = Math.floor(sy[p] / tolerance) + 0;
    const last = cellCount - 1;
    if (last < 0 || cellGroup[last] !== g || cellCol[last] !== c || cellRow[last] !== r) {
      cellStart[cellCount] = p;
      cellGroup[cellCount] = g;
      cellCol[cellCount] = c;
      cellRow[cellCount] = r;
      cellCount++;
    }
  }
  cellStart[cellCount] = m;

  // Union–find over sorted positions; the root of a set is its lowest position.
  const parent = new Int32Array(m);
  for (let p = 0; p < m; p++) parent[p] = p;
  const find = (i: number): number => {
    let r = i;
    while (parent[r] !== r) r = parent[r];
    while (parent[i] !== r) {
      const next = parent[i];
      parent[i] = r;
      i = next;
    }
    return r;
  };
  const union = (a: number, b: number) => {
    const ra = find(a), rb = find(b);
    if (ra < rb) parent[rb] = ra;
    else if (rb < ra) parent[ra] = rb;
  };
  const tol2 = tolerance * tolerance;

  // Each cell's distinct points (its representatives): an end at exactly the point of an earlier one
  // joins it and is never tested again, which keeps thousands of ends at one point linear.
  const reps = new Int32Array(m);
  const repStart = new Int32Array(cellCount + 1);
  let repCount = 0;
  for (let cell = 0; cell < cellCount; cell++) {
    const first = repCount;
    repStart[cell] = first;
    for (let p = cellStart[cell]; p < cellStart[cell + 1]; p++) {
      const x = sx[p], y = sy[p];
      let twin = -1;
      for (let k = first; k < repCount; k++) {
        const q = reps[k];
        if (sx[q] === x && sy[q] === y) { twin = q; break; }
      }
      if (twin >= 0) {
        union(p, twin);
        continue;
      }
      for (let k = first; k < repCount; k++) {
        const q = reps[k];
        const dx = sx[q] - x, dy = sy[q] - y;
        if (dx * dx + dy * dy <= tol2) union(p, q);
      }
      reps[repCount++] = p;
    }
  }
  repStart[cellCount] = repCount;

  /** Tests the representatives of two different cells pairwise. */
  const joinCells = (a: number, b: number) => {
    for (let i = repStart[a]; i < repStart[a + 1]; i++) {
      const p = reps[i];
      const x = sx[p], y = sy[p];
      for (let k = repStart[b]; k < repStart[b + 1]; k++) {
        const q = reps[k];
        const dx = sx[q] - x, dy = sy[q] - y;
        if (dx * dx + dy * dy <= tol2) union(p, q);
      }
    }
  };
  /** Order of cell i against the key (g, c, r): negative, 0 or positive. */
  const compareCell = (i: number, g: number, c: number, r: number) =>
    cellGroup[i] !== g ? cellGroup[i] - g : cellCol[i] !== c ? (cellCol[i] < c ? -1 : 1) : cellRow[i] !== r ? (cellRow[i] < r ? -1 : 1) : 0;
  // The cursor: the first cell not below the last key sought. Keys sought mostly grow, so it moves
  // forward; it gallops, so a key far away (or behind, with huge coordinates) costs a logarithm.
  let cursor = 0;
  /** Moves the cursor to the first cell not below (g, c, r) and returns it (cellCount when none is). */
  const seekCell = (g: number, c: number, r: number): number => {
    let lo: number, hi: number;
    if (cursor < cellCount && compareCell(cursor, g, c, r) < 0) {
      let step = 1;
      lo = cursor + 1;
      hi = lo;
      while (hi < cellCount && compareCell(hi, g, c, r) < 0) {
        lo = hi + 1;
        hi += step;
        step *= 2;
      }
      hi = Math.min(hi, cellCount);
    } else {
      let step = 1;
      hi = cursor;
      lo = hi;
      while (lo > 0 && compareCell(lo - 1, g, c, r) >= 0) {
        hi = lo - 1;
        lo -= step;
        step *= 2;
        if (lo < 0) lo = 0;
      }
    }
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (compareCell(mid, g, c, r) < 0) lo = mid + 1;
      else hi = mid;
    }
    cursor = lo;
    return cursor;
  };
  // Each cell with the cell above it (the next one in the order, when it is adjacent) and the three
  // cells of the next column, whose keys grow with the cell's, so the cursor only moves forward: one
  // seek finds the first of them, and those that exist follow it in the order.
  for (let cell = 0; cell < cellCount; cell++) {
    const g = cellGroup[cell], c = cellCol[cell], r = cellRow[cell];
    if (cell + 1 < cellCount && compareCell(cell + 1, g, c, r + 1) === 0) joinCells(cell, cell + 1);
    for (let b = seekCell(g, c + 1, r - 1); b < cellCount && compareCell(b, g, c + 1, r + 1) <= 0; b++) {
      if (b !== cell) joinCells(cell, b);
    }
  }

  // Clusters: sizes by root, then partners. A cluster of two joins its ends; one of three or more
  // (a branch point) joins its two lowest ends, in input order.
  const root = new Int32Array(m);
  const clusterSize = new Int32Array(m);
  for (let p = 0; p < m; p++) {
    root[p] = parent[p] === p ? p : root[parent[p]];
    clusterSize[root[p]]++;
  }
  const partner = new Int32Array(endCount).fill(-1);
  const crowds = new Map<number, number[]>();
  for (let p = 0; p < m; p++) {
    const r = root[p];
    const size = clusterSize[r];
    if (size === 2) {
      if (r !== p) {
        partner[perm[p]] = perm[r];
        partner[perm[r]] = perm[p];
      }
    } else if (size > 2) {
      let list = crowds.get(r);
      if (!list) crowds.set(r, (list = []));
      list.push(perm[p]);
    }
  }
  const branches: (BranchPoint & { readonly firstEnd: number })[] = [];
  for (const list of crowds.values()) {
    list.sort((a, b) => a - b);
    partner[list[0]] = list[1];
    partner[list[1]] = list[0];
    const set = [...new Set(list.map((e) => e >> 1))].sort((a, b) => a - b);
    branches.push({ x: ends[2 * list[0]], y: ends[2 * list[0] + 1], pieces: set, firstEnd: list[0] });
  }
  branches.sort((a, b) => a.pieces[0] - b.pieces[0] || a.firstEnd - b.firstEnd);

  // Walk: from the lowest unvisited piece go backwards to a free end (or all the way round), then forwards.
  const visited = new Uint8Array(n);
  const links = new Int32Array(n);
  const starts = new Int32Array(n + 1);
  const closedFlags = new Uint8Array(n);
  let linkCount = 0;
  let chainCount = 0;
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
    starts[chainCount] = linkCount;
    closedFlags[chainCount] = closed ? 1 : 0;
    chainCount++;
    // A closed chain starts at `first`, in its own direction; an open one at the free end found above.
    let end = closed ? 2 * first : startEnd;
    for (;;) {
      const piece = end >> 1;
      if (visited[piece]) break;
      visited[piece] = 1;
      links[linkCount++] = end;
      const q = partner[end ^ 1];
      if (q < 0) break;
      end = q;
    }
  }
  starts[chainCount] = linkCount;
  return {
    links,
    starts: starts.subarray(0, chainCount + 1),
    closed: closedFlags.subarray(0, chainCount),
    branches: branches.map(({ x, y, pieces }) => ({ x, y, pieces })),
  };
}
