import { MarkupKind } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { escapeMarkdown, getContourCard, getHover, renderCardPlaintext } from './hover';
import { makeContour, makeResult, openGeometry, openMetrics, PX_UNITS, rectangleGeometry, rectangleMetrics, spanOf } from './testing/fakeResult';

const text = '<svg>\n<rect id="plate" width="10" height="20"/>\n<path d="M0 0 L3 0 L3 4"/>\n</svg>';
const doc = TextDocument.create('file:///h.svg', 'xml', 1, text);
const rectSpan = spanOf(text, '<rect id="plate" width="10" height="20"/>');
const pathSpan = spanOf(text, 'M0 0 L3 0 L3 4');
const rect = { contour: makeContour({ index: 0, span: rectSpan, element: 'rect', id: 'plate' }), metrics: rectangleMetrics(10, 20), geometry: rectangleGeometry(10, 20) };
// Open path (0,0) → (3,0) → (3,4): drawn length 3 + 4 = 7 mm; gap = hypot(3, 4) = 5 mm (3-4-5 triangle).
const open = {
  contour: makeContour({ index: 1, span: pathSpan, closed: false }),
  metrics: openMetrics(7, 5, [0, 0, 3, 4]),
  // Hull: the right triangle with legs 3 and 4 (area 3·4/2 = 6, perimeter 3 + 4 + 5 = 12), inside the rectangle.
  geometry: openGeometry({ areaMm2: 6, perimeterMm: 12 }, 0),
};
const result = makeResult([rect, open]);

function row(card: ReturnType<typeof getContourCard>, label: string): string | undefined {
  return card.rows.find((r) => r.label.startsWith(label))?.value;
}

describe('getContourCard', () => {
  const card = getContourCard(rect, result);

  it('numbers contours from 1 and names the element and id', () => {
    expect(card.title).toBe('Contour #0 (of 2)');
    expect(card.subtitle).toBe('rect #plate');
  });

  it('shows the figures of a 10 × 20 mm rectangle', () => {
    expect(row(card, 'Status')).toBe('closed');
    expect(row(card, 'Segments')).toBe('4');
    expect(row(card, 'Orientation')).toBe('cw (as displayed)');
    expect(row(card, 'Perimeter')).toBe('60 mm'); // rectangle perimeter 2(a+b) = 2(10+20)
    expect(row(card, 'Area')).toBe('200 mm²'); // rectangle area ab = 10·20
    expect(row(card, 'Roundness')).toBe('0.698'); // 4π·200/60² = 0.69813 (by hand)
    expect(row(card, 'Deficit')).toBe('1086.726 mm²'); // 60² − 4π·200 = 3600 − 2513.274 = 1086.726 (by hand)
    expect(row(card, 'Bounding box')).toBe('x 0 … 10, y 0 … 20 mm (10 × 20 mm)');
    expect(row(card, 'Units')).toBe('declared (1 unit = 1 mm)');
  });

  it('shows the reason instead of a number for figures an open contour does not have', () => {
    const c = getContourCard(open, result);
    expect(row(c, 'Status')).toBe('open, gap 5 mm'); // hypot(3, 4) = 5 (3-4-5 triangle)
    expect(row(c, 'Drawn length')).toBe('7 mm'); // 3 + 4
    for (const label of ['Orientation', 'Perimeter', 'Area', 'Roundness', 'Deficit']) {
      expect(row(c, label)).toBe('— (open contour)');
    }
    expect(c.rows.map((r) => r.value).join('\n')).not.toMatch(/NaN|undefined|null/);
  });

  it('shows the rectangle\'s roundness: ρ, R, minimum zone and R − ρ beside the Bonnesen bound', () => {
    expect(row(card, 'Inradius ρ')).toBe('5 mm, centre (5, 10)'); // half the short side
    expect(row(card, 'Circumradius R')).toBe('11.18 mm, centre (5, 10)'); // half the diagonal √(10² + 20²)/2 = 11.1803
    expect(row(card, 'Minimum zone')).toBe('6.18 mm, centre (5, 10)'); // (√500 − 10)/2 = 6.18034 (REFERENCES.md §3.4 rectangle)
    // R − ρ = 11.18034 − 5; √D/π = √1086.726/π = 32.9656/π = 10.4933 (REFERENCES.md §1.3).
    expect(row(card, 'R − ρ')).toBe('6.18 mm measured; Bonnesen bound √D/π = 10.493 mm');
    expect(row(card, 'Convex hull')).toBe('area 200 mm², perimeter 60 mm'); // a convex shape is its own hull
    expect(row(card, 'Convexity')).toBe('1');
    expect(row(card, 'Nesting')).toBe('outer boundary');
    expect(row(card, 'Self-crossing')).toBeUndefined();
  });

  it('says an open contour has no roundness and names the closed contour it lies in', () => {
    const c = getContourCard(open, result);
    for (const label of ['Inradius ρ', 'Circumradius R', 'Minimum zone', 'R − ρ']) expect(row(c, label)).toBe('— (the contour is not closed)');
    expect(row(c, 'Convex hull')).toBe('area 6 mm², perimeter 12 mm');
    expect(row(c, 'Nesting')).toBe('inside contour #0');
  });

  it('says how much a hull taken from the flattened curve may fall short, and nothing when it cannot', () => {
    // A hull known to [area, area + 0.0472] and [perimeter, perimeter + 6.28e-4] (δ·P + πδ² and 2πδ for δ = 1e-4 mm, P = 471.2 mm).
    const flattened = { ...open, geometry: { ...open.geometry, hull: { ...open.geometry.hull, areaErrorMm2: 0.0472, perimeterErrorMm: 6.28e-4 } } };
    expect(row(getContourCard(flattened, result), 'Convex hull')).toBe('area 6 mm² (up to 0.047 mm² more), perimeter 12 mm (up to 0.000628 mm more)');
    const exact = { ...open, geometry: { ...open.geometry, hull: { ...open.geometry.hull, areaErrorMm2: 1e-12, perimeterErrorMm: 0 } } };
    expect(row(getContourCard(exact, result), 'Convex hull')).toBe('area 6 mm², perimeter 12 mm');
  });

  it('calls a bow-tie\'s Q meaningless and gives its Banchoff–Pohl area ∬w² dA = 2 (REFERENCES.md §1.4)', () => {
    const bowTie = {
      ...rect,
      geometry: {
        ...rect.geometry,
        selfIntersections: [{ xMm: 1, yMm: 1, kind: 'crossing' as const, span: pathSpan, otherSpan: pathSpan }],
        roundness: {
          ...rect.geometry.roundness,
          selfCrossing: true,
          minZone: { value: null, reason: 'the contour crosses itself, so it has no inside to zone' },
          bonnesenBoundMm: { value: null, reason: 'the contour crosses itself, so the deficit from its net area is meaningless' },
          windingSquaredAreaMm2: { value: 2 },
        },
      },
    };
    const c = getContourCard(bowTie, makeResult([bowTie]));
    expect(row(c, 'Self-crossing')).toBe('crosses itself once: Q and the deficit from the net area mean nothing here; Banchoff–Pohl L² ≥ 4π∬w² dA with ∬w² dA = 2 mm²');
    expect(row(c, 'R − ρ')).toContain('Bonnesen bound — (the contour crosses itself');
  });

  it('says whether a hole turns opposite its outline (information; orientation as in types.ts)', () => {
    // A 2 × 4 hole inside the 10 × 20 plate: drawn cw like the plate, then ccw (signed area negated).
    const sameWay = { ...rect, contour: makeContour({ index: 1, span: pathSpan }), metrics: rectangleMetrics(2, 4), geometry: { ...rectangleGeometry(2, 4), parent: 0, depth: 1 } };
    const otherWay = { ...sameWay, metrics: { ...sameWay.metrics, signedAreaMm2: { value: -8 }, orientation: 'ccw' as const } };
    expect(row(getContourCard(sameWay, makeResult([rect, sameWay])), 'Nesting')).toBe('hole in contour #0, turning the same way (cw)');
    expect(row(getContourCard(otherWay, makeResult([rect, otherWay])), 'Nesting')).toBe('hole in contour #0, turning the other way (ccw in cw)');
    // The plate's own card counts its hole and gives the part's net area, 10 × 20 − 2 × 4.
    expect(row(getContourCard(rect, makeResult([rect, sameWay])), 'Nesting')).toBe('outer boundary, 1 hole, part net area 192 mm²');
  });

  it('reads floating-point residue as 0: a circle of exact arcs has deficit 0 and R − ρ 0 within R\'s bound', () => {
    // A circle r = 2.2 of exact arcs (L = 2π·2.2, REFERENCES.md §2.1): the deficit 4π²r² − 4π·πr² is 0 up to
    // rounding (here 2.84e-14 mm², below 16 ulp of L² ≈ 6.8e-13); ρ = R = 2.2 up to 8.88e-16 mm.
    const L = 2 * Math.PI * 2.2;
    const circle = {
      ...rect,
      metrics: { ...rect.metrics, lengthMm: L, perimeterMm: { value: L }, deficitMm2: { value: 2.84e-14 } },
      geometry: {
        ...rect.geometry,
        roundness: {
          ...rect.geometry.roundness,
          inradius: { value: { valueMm: 2.2, centreXMm: 15, centreYMm: 15, errorBoundMm: 8.88e-16 } },
          circumradius: { value: { valueMm: 2.2, centreXMm: 15, centreYMm: 15, errorBoundMm: 6.15e-5 } },
          radiusGapMm: { value: 8.88e-16 },
          bonnesenBoundMm: { value: 5.37e-8 },
        },
      },
    };
    const card = getContourCard(circle, makeResult([circle]));
    expect(row(card, 'Deficit L² − 4πA')).toBe('0 mm² (to rounding)');
    expect(row(card, 'Inradius ρ')).toBe('2.2 mm, centre (15, 15)');
    expect(row(card, 'R − ρ')).toBe('0 ± 0.0000615 mm measured; Bonnesen bound √D/π = 5.37e-8 mm');
  });

  it('shows R − ρ with the error bounds of both radii, so a flattened circle\'s residue is not read as a breach of Bonnesen', () => {
    // A circle r = 20 flattened within δ = 5.63e-5: ρ = 20 − δ ± δ, R = 20 ± δ (hull.ts), Bonnesen bound 0 (§1.3: D = 0).
    const delta = 5.63e-5;
    const circle = {
      ...rect,
      geometry: {
        ...rect.geometry,
        roundness: {
          ...rect.geometry.roundness,
          inradius: { value: { valueMm: 20 - delta, centreXMm: 0, centreYMm: 0, errorBoundMm: delta } },
          circumradius: { value: { valueMm: 20, centreXMm: 0, centreYMm: 0, errorBoundMm: delta } },
          radiusGapMm: { value: delta },
          bonnesenBoundMm: { value: 0 },
        },
      },
    };
    expect(row(getContourCard(circle, makeResult([circle])), 'R − ρ')).toBe('0.0000563 ± 0.000113 mm measured; Bonnesen bound √D/π = 0 mm');
  });

  it('says which unit was assumed and where to change it', () => {
    expect(row(getContourCard(rect, makeResult([rect], [], PX_UNITS)), 'Units')).toBe('assumed: px — set loopwise.assumedUnit');
  });
});

describe('getHover', () => {
  it('covers the contour under the cursor with a markdown card over its whole span', () => {
    const hover = getHover(result, doc, spanOf(text, 'L3 0').start, MarkupKind.Markdown);
    // The path is on line 2; `M` sits after `<path d="` (9 characters), `L3 4` ends at 9 + 14 = 23.
    expect(hover?.range).toEqual({ start: { line: 2, character: 9 }, end: { line: 2, character: 23 } });
    expect(hover?.contents).toMatchObject({ kind: 'markdown' });
    const value = (hover?.contents as { value: string }).value;
    expect(value).toContain('Contour \\#1 (of 2)'); // markdown escapes the #
    expect(value).toContain('open, gap 5 mm');
  });

  it('answers null where no contour is', () => {
    expect(getHover(result, doc, 2, MarkupKind.Markdown)).toBeNull();
  });

  it('renders plain text for clients without markdown', () => {
    const hover = getHover(result, doc, rectSpan.start + 3, MarkupKind.PlainText);
    expect(hover?.contents).toEqual({ kind: 'plaintext', value: renderCardPlaintext(getContourCard(rect, result)) });
    expect((hover?.contents as { value: string }).value).toContain('Perimeter: 60 mm');
  });
});

describe('escapeMarkdown', () => {
  it('keeps ids with markup characters literal', () => {
    expect(escapeMarkdown('a|b*c_<d>')).toBe('a\\|b\\*c\\_\\<d\\>');
  });
});
