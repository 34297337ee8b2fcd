import { describe, expect, it } from 'vitest';
import { chainPieces as chainFlat, getChainCount } from './chain';

interface TestPiece { x0: number; y0: number; x1: number; y1: number; group: string }
const piece = (x0: number, y0: number, x1: number, y1: number, group = 'a'): TestPiece => ({ x0, y0, x1, y1, group });
/** chainPieces over readable pieces, its chains read back as objects. */
const chainPieces = (pieces: readonly TestPiece[], tolerance: number) => {
  const names = [...new Set(pieces.map((p) => p.group))];
  const r = chainFlat({
    ends: Float64Array.from(pieces.flatMap((p) => [p.x0, p.y0, p.x1, p.y1])),
    groups: Int32Array.from(pieces.map((p) => names.indexOf(p.group))),
  }, tolerance);
  const chains = Array.from({ length: getChainCount(r) }, (_, k) => ({
    closed: r.closed[k] === 1,
    links: [...r.links.subarray(r.starts[k], r.starts[k + 1])].map((end) => ({ piece: end >> 1, reversed: (end & 1) === 1 })),
  }));
  return { chains, branches: r.branches };
};

describe('chainPieces', () => {
  it('joins a reversed, shuffled square into one closed chain with each piece once', () => {
    // Square (0,0)-(1,0)-(1,1)-(0,1); pieces 1 and 3 drawn backwards, order shuffled.
    const r = chainPieces([piece(1, 1, 1, 0), piece(0, 0, 1, 0), piece(0, 0, 0, 1), piece(1, 1, 0, 1)], 1e-9);
    expect(r.branches).toEqual([]);
    expect(r.chains).toHaveLength(1);
    expect(r.chains[0].closed).toBe(true);
    expect(r.chains[0].links.map((l) => l.piece).sort()).toEqual([0, 1, 2, 3]);
    expect(r.chains[0].links[0]).toEqual({ piece: 0, reversed: false });
  });

  it('walks an open chain from its free end, whatever piece comes first', () => {
    const r = chainPieces([piece(2, 0, 1, 0), piece(0, 0, 1, 0), piece(2, 0, 3, 0)], 1e-9);
    expect(r.chains).toHaveLength(1);
    expect(r.chains[0].closed).toBe(false);
    const l = r.chains[0].links;
    // Either end of the path is a valid start; the walk must be continuous.
    expect(l.map((x) => x.piece)).toEqual(l[0].piece === 1 ? [1, 0, 2] : [2, 0, 1]);
  });

  it('joins ends within the tolerance and not beyond it', () => {
    expect(chainPieces([piece(0, 0, 1, 0), piece(1 + 0.9e-3, 0, 2, 0)], 1e-3).chains).toHaveLength(1);
    expect(chainPieces([piece(0, 0, 1, 0), piece(1 + 1.1e-3, 0, 2, 0)], 1e-3).chains).toHaveLength(2);
  });

  for (const seed of [3, 11, 2024]) {
    it(`clusters ends exactly as an all-pairs distance test does (seeded random ends, seed ${seed})`, () => {
      // Reference computed another way: O(n²) pairwise distances and a flood fill; ends are placed on a
      // coarse lattice plus jitter so many pairs sit just inside and just outside the tolerance.
      let s = seed;
      const rand = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
      const tol = 0.01;
      const at = () => Math.floor(rand() * 12) * 0.006 + (rand() - 0.5) * 0.004;
      const pieces = Array.from({ length: 150 }, () => piece(at(), at(), at(), at()));
      const xs = pieces.flatMap((p) => [p.x0, p.x1]);
      const ys = pieces.flatMap((p) => [p.y0, p.y1]);
      const label = new Array<number>(xs.length).fill(-1);
      for (let e = 0; e < xs.length; e++) {
        if (label[e] >= 0) continue;
        label[e] = e;
        const stack = [e];
        while (stack.length > 0) {
          const a = stack.pop()!;
          for (let b = 0; b < xs.length; b++) {
            if (label[b] < 0 && (xs[a] - xs[b]) ** 2 + (ys[a] - ys[b]) ** 2 <= tol * tol) { label[b] = e; stack.push(b); }
          }
        }
      }
      const clusterSizes = new Map<number, number>();
      for (const l of label) clusterSizes.set(l, (clusterSizes.get(l) ?? 0) + 1);
      const expectedBranches = [...clusterSizes.values()].filter((k) => k >= 3).length;
      expect(chainPieces(pieces, tol).branches).toHaveLength(expectedBranches);
    });
  }

  for (const [seed, offset] of [[5, 0], [17, -3.5], [29, 1e9], [41, -2e13], [53, 1e17]] as const) {
    it(`joins exactly the ends an all-pairs distance test clusters, in several groups (seed ${seed}, offset ${offset})`, () => {
      // Reference computed another way: O(n²) pairwise distances within each group, flood-filled into
      // clusters; a cluster of two joins its ends, one of three or more joins its two lowest ends.
      // Ends sit on a lattice of 0.6 tolerance plus jitter, so pairs fall just inside and outside the
      // tolerance across cell and column borders; the offset moves them far from the origin.
      let s = seed;
      const rand = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
      const tol = offset > 1e12 ? 0.02 : 0.01;
      const at = () => offset + Math.floor(rand() * 10) * 0.6 * tol + (rand() - 0.5) * 0.4 * tol;
      const pieces = Array.from({ length: 200 }, () => piece(at(), at(), at(), at(), rand() < 0.7 ? 'a' : 'b'));
      const endCount = 2 * pieces.length;
      const ex = (e: number) => (e & 1 ? pieces[e >> 1].x1 : pieces[e >> 1].x0);
      const ey = (e: number) => (e & 1 ? pieces[e >> 1].y1 : pieces[e >> 1].y0);
      const label = new Array<number>(endCount).fill(-1);
      for (let e = 0; e < endCount; e++) {
        if (label[e] >= 0) continue;
        label[e] = e;
        const stack = [e];
        while (stack.length > 0) {
          const a = stack.pop()!;
          for (let b = 0; b < endCount; b++) {
            if (label[b] < 0 && pieces[a >> 1].group === pieces[b >> 1].group && (ex(a) - ex(b)) ** 2 + (ey(a) - ey(b)) ** 2 <= tol * tol) {
              label[b] = e;
              stack.push(b);
            }
          }
        }
      }
      const partner = new Array<number>(endCount).fill(-1);
      const clusters = new Map<number, number[]>();
      label.forEach((l, e) => clusters.set(l, [...(clusters.get(l) ?? []), e]));
      for (const list of clusters.values()) {
        if (list.length < 2) continue;
        partner[list[0]] = list[1];
        partner[list[1]] = list[0];
      }
      const r = chainPieces(pieces, tol);
      expect(r.branches).toEqual([...clusters.values()].filter((l) => l.length >= 3)
        .map((l) => ({ x: ex(l[0]), y: ey(l[0]), pieces: [...new Set(l.map((e) => e >> 1))].sort((a, b) => a - b) }))
        .sort((a, b) => a.pieces[0] - b.pieces[0]));
      // Entering a piece at end e leaves it at e ^ 1: each step of a chain goes to that end's partner.
      const entry = (l: { piece: number; reversed: boolean }) => 2 * l.piece + (l.reversed ? 1 : 0);
      const seen = new Set<number>();
      for (const c of r.chains) {
        c.links.forEach((l, i) => {
          seen.add(l.piece);
          if (i + 1 < c.links.length) expect(partner[entry(l) ^ 1]).toBe(entry(c.links[i + 1]));
        });
        const first = entry(c.links[0]), last = entry(c.links[c.links.length - 1]) ^ 1;
        if (c.closed) expect(partner[last]).toBe(first);
        else expect([partner[first], partner[last]]).toEqual([-1, -1]);
      }
      expect(seen.size).toBe(pieces.length);
    });
  }

  it('leaves an end with a NaN coordinate alone and joins infinite ends only at exactly one point (IEEE 754 arithmetic)', () => {
    // NaN is at no distance from anything; Infinity − Infinity is NaN, so infinite ends join only as twins.
    const r = chainPieces([piece(Number.NaN, 0, 1, 0), piece(Number.NaN, 0, 2, 0), piece(Infinity, 0, 5, 5), piece(Infinity, 0, 6, 6), piece(Infinity, 1e-9, 7, 7)], 1e-3);
    expect(r.chains.map((c) => c.links.map((l) => l.piece))).toEqual([[0], [1], [3, 2], [4]]);
  });

  it('treats 5000 ends at one point as one branch point', () => {
    const pieces = Array.from({ length: 5000 }, (_, i) => piece(0, 0, i, 5));
    const r = chainPieces(pieces, 1e-3);
    expect(r.branches).toHaveLength(1);
    expect(r.branches[0].pieces).toHaveLength(5000);
  });

  it('reports three ends at one point as a branch with all three pieces', () => {
    const r = chainPieces([piece(0, 0, 1, 0), piece(1, 0, 2, 0), piece(1, 0, 1, 1)], 1e-9);
    expect(r.branches).toEqual([{ x: 1, y: 0, pieces: [0, 1, 2] }]);
  });

  it('chains 10 000 segments of a polygon given in reverse order (scales, common practice)', () => {
    const n = 10_000;
    const pts = Array.from({ length: n }, (_, i) => [Math.cos((2 * Math.PI * i) / n), Math.sin((2 * Math.PI * i) / n)]);
    const pieces = pts.map((_, i) => piece(pts[(i + 1) % n][0], pts[(i + 1) % n][1], pts[i][0], pts[i][1])).reverse();
    const r = chainPieces(pieces, 1e-9);
    expect(r.chains).toHaveLength(1);
    expect(r.chains[0].closed).toBe(true);
    expect(r.chains[0].links).toHaveLength(n);
  });
});
