/**
 * The DXF benchmark's input, its floor and its least reader (dxf.bench.ts).
 */
import { parseDecimal } from '../../server/src/engine/formats/dxf/groups';

/**
 * An ASCII DXF of `entities` loose LINE/ARC entities in mm: open outlines of 3 lines + 1 arc each on a
 * 20 mm grid (the bottom edge is missing, so every outline is open with a 10 mm gap), shuffled with a
 * seeded LCG so chaining has work to do. Built from one string per entity, so building it costs little
 * memory beside the text itself.
 */
export function makeLooseDxf(entities: number): string {
  const shapes = Math.ceil(entities / 4);
  const cols = Math.ceil(Math.sqrt(shapes));
  const parts: string[] = [];
  const line = (x0: number, y0: number, x1: number, y1: number) => `0\nLINE\n8\nCUT\n10\n${x0}\n20\n${y0}\n30\n0\n11\n${x1}\n21\n${y1}\n31\n0\n`;
  for (let k = 0; k < shapes; k++) {
    const x = (k % cols) * 20, y = Math.floor(k / cols) * 20;
    // Right, top and left edges and a corner arc.
    parts.push(line(x + 15, y + 5, x + 15, y + 15), line(x + 15, y + 15, x, y + 15), line(x, y + 15, x, y));
    parts.push(`0\nARC\n8\nCUT\n10\n${x + 10}\n20\n${y + 5}\n30\n0\n40\n5\n50\n270\n51\n360\n`);
  }
  let s = 12345;
  for (let i = parts.length - 1; i > 0; i--) {
    s = (s * 1103515245 + 12345) % 2 ** 31;
    const j = s % (i + 1);
    [parts[i], parts[j]] = [parts[j]!, parts[i]!];
  }
  return `0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n${parts.join('')}0\nENDSEC\n0\nEOF\n`;
}

/** The floor: walk every line pair, parse the group code, convert numeric values (codes 10–59). */
export function tokenizeFloor(text: string): number {
  let pos = 0;
  let sum = 0;
  const n = text.length;
  while (pos < n) {
    let nl = text.indexOf('\n', pos);
    if (nl < 0) nl = n;
    let code = 0;
    for (let i = pos; i < nl; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d >= 0 && d <= 9) code = code * 10 + d;
    }
    pos = nl + 1;
    let nl2 = text.indexOf('\n', pos);
    if (nl2 < 0) nl2 = n;
    if (code >= 10 && code < 60) sum += Number(text.slice(pos, nl2));
    pos = nl2 + 1;
  }
  return sum;
}

/** What `readLeast` finds: contours, open ones among them, and their total length (mm). */
export interface LeastCounts {
  readonly contours: number;
  readonly open: number;
  readonly lengthMm: number;
}

const LEAST_BITS = new Float64Array(1);
const LEAST_WORDS = new Int32Array(LEAST_BITS.buffer);

/** Continues hash `h` with the 64 bits of `v` (murmur3 block steps). */
function hashBits(h: number, v: number): number {
  LEAST_BITS[0] = v;
  for (let w = 0; w < 2; w++) {
    h ^= Math.imul(LEAST_WORDS[w]!, 0xcc9e2d51);
    h = Math.imul((h << 13) | (h >>> 19), 5) + 0xe6546b64;
  }
  return h;
}

/** A table slot hash of a point's coordinates (murmur3 steps and its finaliser). */
function hashPoint(x: number, y: number): number {
  let h = hashBits(hashBits(0, x), y);
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  return (h ^ (h >>> 13)) >>> 0;
}

/** readLeast's pieces: start x, y, end x, y (`ends`), length and entity start of each. */
class LeastPieces {
  ends = new Float64Array(4 * 1024);
  lengths = new Float64Array(1024);
  starts = new Int32Array(1024);
  count = 0;

  /** Adds a LINE (kind 1; v: x0, y0, x1, y1) or an ARC (kind 2; v: cx, cy, r, start°, end°). */
  add(kind: number, v: Float64Array, entityStart: number): void {
    const k = this.count++;
    if (k === this.starts.length) this.grow();
    const { ends } = this, o = 4 * k;
    if (kind === 1) {
      ends[o] = v[0]!;
      ends[o + 1] = v[1]!;
      ends[o + 2] = v[2]!;
      ends[o + 3] = v[3]!;
      this.lengths[k] = Math.sqrt((v[2]! - v[0]!) ** 2 + (v[3]! - v[1]!) ** 2);
    } else {
      const r = v[2]!, from = (v[3]! * Math.PI) / 180, to = (v[4]! * Math.PI) / 180;
      ends[o] = v[0]! + r * Math.cos(from);
      ends[o + 1] = v[1]! + r * Math.sin(from);
      ends[o + 2] = v[0]! + r * Math.cos(to);
      ends[o + 3] = v[1]! + r * Math.sin(to);
      this.lengths[k] = r * ((((to - from) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI) || 2 * Math.PI);
    }
    this.starts[k] = entityStart;
  }

  private grow(): void {
    const ends = new Float64Array(2 * this.ends.length), lengths = new Float64Array(2 * this.lengths.length), starts = new Int32Array(2 * this.starts.length);
    ends.set(this.ends);
    lengths.set(this.lengths);
    starts.set(this.starts);
    this.ends = ends;
    this.lengths = lengths;
    this.starts = starts;
  }
}

/**
 * The least reader, a lower bound to compare with: the floor plus the least that any reader must add
 * to hand an editor this file's contours and open-contour problems, and nothing more. It keeps each
 * entity's start, reads LINE and ARC end points and lengths, joins ends that round to the same
 * micrometre through a hash table, walks the chains, and makes one result object per contour and one
 * problem (message and related place) per open contour. It leaves out what our reader and analysis
 * also do: a tolerance search, branch points, line numbers, spans, layers, units, duplicates, fixes,
 * segments, intersections, nesting and every measure but the length. Only LINE and ARC (the bench
 * file's entities) are read.
 */
export function readLeast(text: string): LeastCounts {
  const pieces = new LeastPieces();
  /** The entity being read: 1 LINE, 2 ARC, 0 anything else; its start and values (see LeastPieces.add). */
  let kind = 0, entityStart = 0;
  const v = new Float64Array(5);
  // The floor's walk, keeping entity starts and the values a LINE or ARC needs (written out again, not
  // shared: a callback per pair would slow the floor it is compared with). An entity ends at the next
  // 0 group (ENDSEC after the last one).
  let pos = 0;
  const n = text.length;
  while (pos < n) {
    const codeStart = pos;
    let nl = text.indexOf('\n', pos);
    if (nl < 0) nl = n;
    let code = 0;
    for (let i = pos; i < nl; i++) {
      const digit = text.charCodeAt(i) - 48;
      if (digit >= 0 && digit <= 9) code = code * 10 + digit;
    }
    pos = nl + 1;
    let nl2 = text.indexOf('\n', pos);
    if (nl2 < 0) nl2 = n;
    if (code === 0) {
      if (kind !== 0) pieces.add(kind, v, entityStart);
      entityStart = codeStart;
      kind = text.startsWith('LINE', pos) ? 1 : text.startsWith('ARC', pos) ? 2 : 0;
    } else if (code >= 10 && code < 60) {
      // The engine's exact fast path for plain decimals (no slice), faster than the floor's Number.
      let value = parseDecimal(text, pos, nl2);
      if (Number.isNaN(value)) value = Number(text.slice(pos, nl2));
      const slot = code === 10 ? 0 : code === 20 ? 1 : code === 11 || code === 40 ? 2 : code === 21 || code === 50 ? 3 : code === 51 ? 4 : -1;
      if (slot >= 0) v[slot] = value;
    }
    pos = nl2 + 1;
  }
  const { ends, lengths, starts, count } = pieces;

  // Ends that round to one micrometre join (arc ends from cos and sin miss the line ends by ~1e-13 mm).
  // A radix hash join, as it reads memory in order: the ends (end 2k the start of piece k, 2k + 1 its
  // end) are partitioned by the top bits of their points' hash into buckets of ~1000, each then joined
  // through a small table that stays in cache.
  const endCount = 2 * count;
  const hashes = new Uint32Array(endCount);
  let bits = 0;
  while (bits < 20 && endCount >> bits > 1024) bits++;
  const bucketOf = (h: number) => (bits === 0 ? 0 : h >>> (32 - bits));
  const bucketStart = new Int32Array((1 << bits) + 1);
  for (let e = 0; e < endCount; e++) {
    const h = hashPoint(Math.round(ends[2 * e]! * 1000), Math.round(ends[2 * e + 1]! * 1000));
    hashes[e] = h;
    bucketStart[bucketOf(h) + 1]++;
  }
  for (let k = 0; k < 1 << bits; k++) bucketStart[k + 1] += bucketStart[k]!;
  const next = bucketStart.slice(0, 1 << bits);
  const bx = new Float64Array(endCount), by = new Float64Array(endCount), be = new Int32Array(endCount), bh = new Uint32Array(endCount);
  for (let e = 0; e < endCount; e++) {
    const h = hashes[e]!, at = next[bucketOf(h)]++;
    bh[at] = h;
    bx[at] = Math.round(ends[2 * e]! * 1000);
    by[at] = Math.round(ends[2 * e + 1]! * 1000);
    be[at] = e;
  }
  const partner = new Int32Array(endCount).fill(-1);
  const table = new Int32Array(4096);
  for (let k = 0; k < 1 << bits; k++) {
    const from = bucketStart[k]!, to = bucketStart[k + 1]!;
    let size = 2;
    while (size < 2 * (to - from)) size *= 2;
    const local = size <= table.length ? table.fill(-1, 0, size) : new Int32Array(size).fill(-1);
    for (let i = from; i < to; i++) {
      const x = bx[i]!, y = by[i]!;
      for (let s = bh[i]! & (size - 1); ; s = (s + 1) & (size - 1)) {
        const j = local[s]!;
        if (j < 0) {
          local[s] = i;
          break;
        }
        if (bx[j] === x && by[j] === y) {
          const p = be[j]!, e = be[i]!;
          if (partner[p]! < 0) {
            partner[p] = e;
            partner[e] = p;
          }
          break;
        }
      }
    }
  }

  // Chains, each from its free start (or its lowest piece when closed): one object per contour, one
  // problem per open one.
  const visited = new Uint8Array(count);
  const contours: { index: number; closed: boolean; span: { start: number; end: number }; lengthMm: number }[] = [];
  const problems: { span: { start: number; end: number }; message: string; related: { span: { start: number; end: number }; message: string }[] }[] = [];
  let lengthMm = 0;
  for (let first = 0; first < count; first++) {
    if (visited[first]) continue;
    let startEnd = 2 * first, closed = false;
    for (let q = partner[startEnd]!; q >= 0; q = partner[startEnd]!) {
      if (q >> 1 === first) {
        closed = true;
        break;
      }
      startEnd = q ^ 1;
    }
    const head = closed ? 2 * first : startEnd;
    let end = head, length = 0, last = end;
    while (end >= 0 && !visited[end >> 1]) {
      visited[end >> 1] = 1;
      length += lengths[end >> 1]!;
      last = end;
      end = partner[end ^ 1]!;
    }
    lengthMm += length;
    // Places are the start of the first and last entity (a reader keeps more: whole spans, lines).
    const span = { start: starts[head >> 1]!, end: starts[head >> 1]! };
    const contour = { index: contours.length, closed, span, lengthMm: length };
    contours.push(contour);
    if (closed) continue;
    const sx = ends[2 * head]!, sy = ends[2 * head + 1]!, ex = ends[2 * (last ^ 1)]!, ey = ends[2 * (last ^ 1) + 1]!;
    const gap = Math.round(Math.sqrt((ex - sx) ** 2 + (ey - sy) ** 2) * 1000) / 1000;
    problems.push({
      span, message: `Contour #${contour.index} is open: its end is ${gap} mm from its start.`,
      related: [{ span: { start: starts[last >> 1]!, end: starts[last >> 1]! }, message: `Contour #${contour.index} ends here.` }],
    });
  }
  return { contours: contours.length, open: problems.length, lengthMm };
}
