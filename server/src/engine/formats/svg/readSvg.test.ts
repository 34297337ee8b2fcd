import fc from 'fast-check';
import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { measureContour } from '../../geometry/measure';
import type { Contour, ReadResult, SourceSpan } from '../../types';
import { readSvg } from './readSvg';

/** One user unit = 1 mm (REFERENCES §5.8: width in mm over a viewBox of the same size). */
const mmDoc = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">\n${body}\n</svg>`;
const read = (text: string, assumedUnit: 'auto' | 'mm' | 'in' = 'auto'): ReadResult => readSvg(text, { assumedUnit });
const at = (text: string, span: SourceSpan) => text.slice(span.start, span.end);
const metrics = (c: Contour) => measureContour(c, 'down');
const area = (c: Contour) => {
  const a = metrics(c).signedAreaMm2;
  if (a.value === null) throw new Error(a.reason);
  return a.value;
};
const perimeter = (c: Contour) => {
  const p = metrics(c).perimeterMm;
  if (p.value === null) throw new Error(p.reason);
  return p.value;
};

describe('readSvg: basic shapes', () => {
  it.each([
    // REFERENCES §2.9 (rounded rectangles, SVG 2 rx/ry auto rules of §5.6)
    ['rx=ry=2', '<rect width="10" height="6" rx="2" ry="2"/>', 56.56637061435917, 28.56637061435917],
    ['rx=2, ry auto copies rx', '<rect width="10" height="6" rx="2"/>', 56.56637061435917, 28.56637061435917],
    ['rx auto copies ry=2', '<rect width="10" height="6" ry="2"/>', 56.56637061435917, 28.56637061435917],
    ['rx=3 ry=1', '<rect width="10" height="6" rx="3" ry="1"/>', 57.42477796076938, 29.36489322055526],
    ['rx=8 clamps to 5, ry copies 8 and clamps to 3: a full ellipse', '<rect width="10" height="6" rx="8"/>', 15 * Math.PI, 25.52699886339813],
    ['plain 10×6 (no rounding)', '<rect x="1" y="2" width="10" height="6"/>', 60, 32],
  ])('draws a rect with %s to the areas of REFERENCES §2.9', (_name, body, a, l) => {
    const text = mmDoc(body);
    const { contours, problems } = read(text);
    expect(problems).toEqual([]);
    expect(contours).toHaveLength(1);
    const c = contours[0]!;
    expect(c.closed).toBe(true);
    // Positive: the SVG 2 equivalent path runs clockwise on screen (REFERENCES §0, §5.6).
    expect(area(c)).toBeCloseTo(a, 10);
    expect(perimeter(c)).toBeCloseTo(l, 9);
  });

  it('does not draw a rect of zero width or a circle of zero radius (SVG 2 Basic Shapes)', () => {
    const { contours, problems } = read(mmDoc('<rect width="0" height="5"/><rect width="5"/><circle r="0"/><ellipse rx="auto" ry="auto"/>'));
    expect(contours).toEqual([]);
    expect(problems).toEqual([]);
  });

  it('draws a circle as a closed loop of area πr² and length 2πr from 3 o\'clock (REFERENCES §2.1, §5.6)', () => {
    const text = mmDoc('<circle id="c1" cx="50" cy="40" r="10"/>');
    const [c] = read(text).contours;
    expect(c).toMatchObject({ element: 'circle', id: 'c1', closed: true, startX: 60, startY: 40 });
    expect(area(c!)).toBeCloseTo(100 * Math.PI, 10);
    expect(perimeter(c!)).toBeCloseTo(20 * Math.PI, 10);
    expect(c!.segments.every((s) => s.kind === 'arc')).toBe(true);
  });

  it('draws an ellipse with the perimeter 4aE(m) of REFERENCES §2.4 (a=2, b=1)', () => {
    const [c] = read(mmDoc('<ellipse cx="5" cy="5" rx="2" ry="1"/>')).contours;
    expect(perimeter(c!)).toBeCloseTo(9.6884482205476761984, 9);
    expect(area(c!)).toBeCloseTo(2 * Math.PI, 10);
  });

  it('draws line and polyline open, polygon closed; polygon L-shape has area 3 (REFERENCES §2.8)', () => {
    const text = mmDoc('<line x1="1" y1="2" x2="3" y2="4"/><polyline points="0,0 2,0 2,1"/><polygon points="0,0 0,2 1,2 1,1 2,1 2,0"/>');
    const [l, pl, pg] = read(text).contours;
    expect(l).toMatchObject({ element: 'line', closed: false, startX: 1, startY: 2 });
    expect(pl).toMatchObject({ element: 'polyline', closed: false });
    expect(pl!.segments).toHaveLength(2);
    expect(pg).toMatchObject({ element: 'polygon', closed: true });
    expect(Math.abs(area(pg!))).toBeCloseTo(3, 12);
  });

  it('gives polyline segments the span of the coordinate pair they end at', () => {
    const text = mmDoc('<polyline points="0,0  2,0 2 , 1"/>');
    const [c] = read(text).contours;
    expect(c!.segments.map((s) => at(text, s.span))).toEqual(['2,0', '2 , 1']);
    expect(at(text, c!.startSpan)).toBe('0,0');
    expect(at(text, c!.endSpan)).toBe('2 , 1');
    expect(at(text, c!.span)).toBe('<polyline points="0,0  2,0 2 , 1"/>');
  });

  it('drops an odd last coordinate of points and reports it (SVG 2 Basic Shapes; REFERENCES §5.2)', () => {
    const text = mmDoc('<polygon points="0,0 10,0 10,10 5"/>');
    const { contours, problems } = read(text);
    expect(contours[0]!.segments).toHaveLength(2);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ checkId: 'parse-error', messageId: 'value', data: { attribute: 'points' } });
    expect(at(text, problems[0]!.span)).toBe('5');
  });

  it('reports an invalid numeric value at the value and treats it as missing (CSS: invalid values are ignored)', () => {
    const text = mmDoc('<rect width="abc" height="5"/><circle r="-3"/><rect width="4" height="4" rx="-1"/>');
    const { contours, problems } = read(text);
    expect(contours).toHaveLength(1); // the third rect, rx ignored → sharp corners
    expect(contours[0]!.segments.every((s) => s.kind === 'line')).toBe(true);
    expect(problems.map((p) => [p.messageId, p.data.attribute, at(text, p.span)])).toEqual([
      ['value', 'width', 'abc'], ['value', 'r', '-3'], ['value', 'rx', '-1'],
    ]);
  });

  it('resolves percentages against the viewBox: width 50% of 100 = 50 (SVG 2 Coordinate Systems, Units)', () => {
    const [c] = read(mmDoc('<rect width="50%" height="10%"/>')).contours;
    expect(area(c!)).toBeCloseTo(500, 10);
  });
});

describe('readSvg: spans', () => {
  it('gives shapes their start tag as span, startSpan, endSpan and elementSpan', () => {
    const text = mmDoc('<g>\n  <rect id="r" x="1" y="1" width="5" height="5"></rect>\n</g>');
    const [c] = read(text).contours;
    const tag = '<rect id="r" x="1" y="1" width="5" height="5">';
    for (const s of [c!.span, c!.startSpan, c!.endSpan, c!.elementSpan, c!.segments[0]!.span]) expect(at(text, s)).toBe(tag);
    expect(c!.index).toBe(0);
  });

  it('gives path contours the subpath spans from the d value and the start tag as elementSpan', () => {
    const text = mmDoc('<path id="p" d="M0 0 L10 0 L10 10 Z M20 20 L30 20"/>');
    const [a, b] = read(text).contours;
    expect(at(text, a!.span)).toBe('M0 0 L10 0 L10 10 Z');
    expect(at(text, b!.span)).toBe('M20 20 L30 20');
    expect(at(text, a!.elementSpan)).toBe('<path id="p" d="M0 0 L10 0 L10 10 Z M20 20 L30 20"/>');
    expect([a!.index, b!.index]).toEqual([0, 1]);
    expect(a!.closed).toBe(true);
    expect(b!.closed).toBe(false);
    expect(b!.closeFix).toBeDefined();
    expect(a!.id).toBe('p');
  });

  it('counts offsets in UTF-16 code units after astral characters (saxes `position` is a string index)', () => {
    const text = mmDoc('<!-- 😀😀 --><path d="M0 0 H5"/><rect width="1" height="1"/>');
    const [p, r] = read(text).contours;
    expect(at(text, p!.span)).toBe('M0 0 H5');
    expect(at(text, r!.elementSpan)).toBe('<rect width="1" height="1"/>');
  });

  it('maps spans of a d value with character references back to the raw text', () => {
    const text = mmDoc('<path d="M0&#x20;0 L10&#32;0 L10 10&#10;Z"/>');
    const { contours, problems } = read(text);
    expect(problems).toEqual([]);
    const [c] = contours;
    expect(at(text, c!.span)).toBe('M0&#x20;0 L10&#32;0 L10 10&#10;Z');
    expect(at(text, c!.segments[0]!.span)).toContain('L10&#32;0');
    expect(c!.segments).toHaveLength(2);
  });

  it('reports a path data error at its position with the path drawn up to it (REFERENCES §5.2)', () => {
    const text = mmDoc('<path d="M 10,10 L 20,20 X 5"/>');
    const { contours, problems } = read(text);
    expect(contours[0]!.segments).toHaveLength(1);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ checkId: 'parse-error', messageId: 'pathData' });
    expect(at(text, problems[0]!.span).startsWith('X')).toBe(true);
  });
});

describe('readSvg: units', () => {
  it('measures a 100 mm square drawn in a 1000-unit viewBox on width="100mm" as 100 mm (CSS Values: 96 px/in, 25.4 mm/in)', () => {
    const text = '<svg width="100mm" height="100mm" viewBox="0 0 1000 1000"><rect width="1000" height="1000"/></svg>';
    const { contours, units } = read(text);
    expect(units.declared).toBe(true);
    expect(units.mmPerUnit).toBeCloseTo(0.1, 15);
    expect(at(text, units.span)).toBe('<svg width="100mm" height="100mm" viewBox="0 0 1000 1000">');
    expect(perimeter(contours[0]!)).toBeCloseTo(400, 10);
    expect(area(contours[0]!)).toBeCloseTo(10000, 8);
  });

  it('takes a unitless width as CSS px: a 96-unit square is 25.4 mm wide (CSS Values: 96 px per inch)', () => {
    const [c] = read('<svg width="96" height="96"><rect width="96" height="96"/></svg>').contours;
    expect(metrics(c!).bboxMm[2]).toBeCloseTo(25.4, 12);
  });

  it('assumes px (auto) or the chosen unit when the file declares no size', () => {
    const text = '<svg viewBox="0 0 10 10"><rect width="10" height="10"/></svg>';
    expect(read(text).units).toMatchObject({ declared: false, assumed: 'px', mmPerUnit: 25.4 / 96 });
    const inches = read(text, 'in');
    expect(inches.units).toMatchObject({ declared: false, assumed: 'in', mmPerUnit: 25.4 });
    expect(metrics(inches.contours[0]!).bboxMm[2]).toBeCloseTo(254, 10);
  });

  it('places a nested svg viewport by x, y, width, height and viewBox (SVG 2 Coordinate Systems)', () => {
    const [c] = read(mmDoc('<svg x="10" y="20" width="30" height="30" viewBox="0 0 3 3"><rect width="3" height="3"/></svg>')).contours;
    const box = metrics(c!).bboxMm;
    [10, 20, 40, 50].forEach((v, i) => expect(box[i]).toBeCloseTo(v, 12));
  });
});

describe('readSvg: transforms', () => {
  it('composes nested transforms: g translate(10,20) > rect rotate(90) scale(2) maps (1,0) to (10,22) (REFERENCES §5.7)', () => {
    const [c] = read(mmDoc('<g transform="translate(10,20)"><line x2="1" transform="rotate(90) scale(2)"/></g>')).contours;
    const s = c!.segments[0]!;
    expect(s.x0).toBeCloseTo(10, 12);
    expect(s.y0).toBeCloseTo(20, 12);
    expect(s.x1).toBeCloseTo(10, 12);
    expect(s.y1).toBeCloseTo(22, 12);
  });

  it('scales areas by |det| and flips their sign under a mirror, for lines and arcs (REFERENCES §5.7)', () => {
    const text = mmDoc(
      '<polygon points="0,0 2,0 2,1 1,1 1,2 0,2"/><circle r="1"/>' +
      '<g transform="scale(2,-1)"><polygon points="0,0 2,0 2,1 1,1 1,2 0,2"/><circle r="1"/></g>' +
      '<g transform="matrix(2 1 0.5 3 7 -4)"><polygon points="0,0 2,0 2,1 1,1 1,2 0,2"/><circle r="1"/></g>',
    );
    const [poly, circle, mPoly, mCircle, sPoly, sCircle] = read(text).contours.map(area);
    expect(poly).toBeCloseTo(3, 12); // REFERENCES §2.8 L-shape
    expect(circle).toBeCloseTo(Math.PI, 12); // §2.1
    expect(mPoly).toBeCloseTo(-2 * poly!, 12);
    expect(mCircle).toBeCloseTo(-2 * circle!, 12);
    expect(sPoly).toBeCloseTo(5.5 * poly!, 10); // det = 2·3 − 1·0.5
    expect(sCircle).toBeCloseTo(5.5 * circle!, 10);
  });

  it('reports an invalid transform and draws the element untransformed (as browsers do)', () => {
    const text = mmDoc('<rect width="2" height="2" transform="rotate(1,2)"/>');
    const { contours, problems } = read(text);
    expect(contours).toHaveLength(1);
    expect(problems[0]).toMatchObject({ messageId: 'value', data: { attribute: 'transform' } });
    expect(at(text, problems[0]!.span)).toBe('rotate(1,2)');
  });

  it('reports an invalid transform of a path once, and only when the path draws something', () => {
    const text = mmDoc('<path d="M0 0H2V2Z" transform="scale(1,2,3)"/><path d="" transform="skewX()"/>');
    const { contours, problems } = read(text);
    expect(contours).toHaveLength(1);
    expect(problems.map((p) => at(text, p.span))).toEqual(['scale(1,2,3)']);
  });
});

describe('readSvg: what is drawn (SVG 2 Rendering, Structural)', () => {
  it('does not draw defs, symbol, clipPath, mask, pattern, marker, metadata, title, text or display:none content', () => {
    const text = mmDoc([
      '<defs><rect width="1" height="1"/></defs>',
      '<symbol id="s"><rect width="1" height="1"/></symbol>',
      '<clipPath><rect width="1" height="1"/></clipPath><mask><rect width="1" height="1"/></mask>',
      '<pattern><rect width="1" height="1"/></pattern><marker><rect width="1" height="1"/></marker>',
      '<metadata><rect width="1" height="1"/></metadata><title>t</title><text x="1">Label</text>',
      '<rect width="1" height="1" display="none"/>',
      '<g style="fill:red; display : none !important"><rect width="1" height="1"/></g>',
      '<g display="none"><g><rect width="1" height="1"/></g></g>',
      '<rect id="shown" width="1" height="1" visibility="hidden"/>',
    ].join('\n'));
    const { contours, problems } = read(text);
    expect(problems).toEqual([]);
    expect(contours.map((c) => c.id)).toEqual(['shown']);
  });

  it('draws a used element at the use with x/y, keeping the original spans and the use as elementSpan', () => {
    const text = mmDoc('<defs><rect id="r" width="2" height="3"/></defs>\n<use href="#r" x="10" y="5"/><use xlink:href="#r" transform="translate(20)"/>');
    const { contours, problems } = read(text);
    expect(problems).toEqual([]);
    expect(contours).toHaveLength(2);
    const [a, b] = contours;
    expect(at(text, a!.span)).toBe('<rect id="r" width="2" height="3"/>');
    expect(at(text, a!.elementSpan)).toBe('<use href="#r" x="10" y="5"/>');
    expect(at(text, b!.elementSpan)).toBe('<use xlink:href="#r" transform="translate(20)"/>');
    expect([a!.startX, a!.startY, b!.startX, b!.startY]).toEqual([10, 5, 20, 0]);
    expect(a).toMatchObject({ element: 'rect', id: 'r', index: 0 });
  });

  it('draws a used symbol through its viewBox into the use width/height (SVG 2 Structural, "The use element")', () => {
    const text = mmDoc('<symbol id="s" viewBox="0 0 1 1"><circle cx="0.5" cy="0.5" r="0.5"/></symbol><use href="#s" x="10" width="20" height="20"/>');
    const [c] = read(text).contours;
    expect(area(c!)).toBeCloseTo(100 * Math.PI, 10);
    const box = metrics(c!).bboxMm;
    [10, 0, 30, 20].forEach((v, i) => expect(box[i]).toBeCloseTo(v, 12));
  });

  it('reports a circular use and a missing target without hanging', () => {
    const text = mmDoc('<g id="a"><rect width="1" height="1"/><use href="#a"/></g><use id="u1" href="#u2"/><use id="u2" href="#u1"/><use href="#nope"/>');
    const { contours, problems } = read(text);
    expect(contours).toHaveLength(1);
    expect(problems.map((p) => [p.messageId, at(text, p.span)])).toEqual([
      ['value', '#a'], ['value', '#u2'], ['value', '#u1'], ['value', '#nope'],
    ]);
  });

  it('stops expanding uses that multiply exponentially (6 levels × 10 uses) and says so', () => {
    let defs = '<g id="a0"><rect width="1" height="1"/></g>';
    for (let k = 1; k <= 6; k++) defs += `<g id="a${k}">${`<use href="#a${k - 1}"/>`.repeat(10)}</g>`;
    const { contours, problems } = read(mmDoc(`<defs>${defs}</defs><use href="#a6"/>`));
    expect(contours.length).toBeLessThanOrEqual(100_000);
    expect(contours.length).toBeGreaterThan(1000);
    expect(problems.map((p) => p.messageId)).toContain('unsupported');
  });

  it('draws what is nested up to 512 levels and reports, once, the first element deeper; 100 000 levels do not exhaust the stack', () => {
    const nested = (levels: number, inner: string) => `${'<g>'.repeat(levels)}${inner}${'</g>'.repeat(levels)}`;
    // The outer svg's children are at level 1: the rect inside 511 groups is at level 512, the g inside 512 at 513.
    const text = mmDoc(nested(511, '<rect id="in" width="1" height="1"/>') + nested(512, '<g id="deep"><rect width="1" height="1"/></g>') + nested(100_000, '<rect width="1" height="1"/>'));
    const { contours, problems } = read(text);
    expect(contours.map((c) => c.id)).toEqual(['in']);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ messageId: 'unsupported' });
    expect(at(text, problems[0]!.span)).toBe('<g id="deep">');
  });

  it('draws the first switch child without unmet requiredExtensions (SVG 2 Structural, "The switch element")', () => {
    const text = mmDoc('<switch><foreignObject requiredExtensions="urn:x"><rect width="1" height="1"/></foreignObject><g><rect id="yes" width="1" height="1"/></g><rect id="no" width="1" height="1"/></switch>');
    expect(read(text).contours.map((c) => c.id)).toEqual(['yes']);
  });
});

describe('readSvg: malformed XML', () => {
  /** Offset of saxes's 1-based line and code-point column (its `column` counts code points). */
  function offsetOf(text: string, line: number, column: number): number {
    let offset = 0;
    for (let l = 1; l < line; l++) offset = text.indexOf('\n', offset) + 1;
    for (let c = 0; c < column; c++) offset += text.codePointAt(offset)! > 0xffff ? 2 : 1;
    return offset;
  }

  it('reports the error where saxes finds it (line/column mapped to the offset) and keeps what came before', () => {
    const text = '<svg width="10mm" height="10mm" viewBox="0 0 10 10">\n<!-- 😀 --> <rect width="1" height="1"/>\n<g><path d="M0 0 H1"></g>\n<rect width="2" height="2"/></svg>';
    const parser = new SaxesParser({ position: true });
    let where: [number, number] | undefined;
    parser.on('error', () => {
      where ??= [parser.line, parser.column];
    });
    parser.write(text).close();
    const { contours, problems } = read(text);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ checkId: 'parse-error', messageId: 'xml', data: { detail: 'unexpected close tag' } });
    expect(problems[0]!.span.end).toBe(offsetOf(text, where![0], where![1]));
    expect(contours.map((c) => c.element)).toEqual(['rect', 'path']);
  });

  it('points at the innermost unclosed start tag at the end of input', () => {
    const text = '<svg><g id="x"><rect width="1" height="1"/>';
    const { contours, problems } = read(text);
    expect(contours).toHaveLength(1);
    expect(at(text, problems[0]!.span)).toBe('<g id="x">');
  });

  it('reads entities declared in the DOCTYPE internal subset (XML 1.0 §4.2)', () => {
    const text = '<?xml version="1.0"?>\n<!DOCTYPE svg [\n<!ENTITY w "10mm">\n]>\n<svg width="&w;" height="&w;" viewBox="0 0 10 10"><rect width="10" height="10"/></svg>';
    const { contours, problems, units } = read(text);
    expect(problems).toEqual([]);
    expect(units.declared).toBe(true);
    expect(perimeter(contours[0]!)).toBeCloseTo(40, 12);
  });

  it('reports an empty document and a non-svg root without contours', () => {
    expect(read('').problems[0]).toMatchObject({ messageId: 'xml' });
    expect(read('<html/>').problems[0]).toMatchObject({ messageId: 'unsupported' });
  });

  it('never throws, whatever the text (property test, fast-check seed 42)', () => {
    const base = mmDoc('<g transform="rotate(30)"><path d="M0 0 L10 0 A5 5 0 0 1 0 0Z"/><rect width="4" height="3" rx="1"/></g><use href="#q"/><polyline id="q" points="1,2 3,4"/>');
    fc.assert(
      fc.property(fc.integer({ min: 0, max: base.length }), fc.integer({ min: 0, max: 20 }), fc.string(), (pos, cut, insert) => {
        const text = base.slice(0, pos) + insert + base.slice(pos + cut);
        const r = read(text);
        for (const c of r.contours) for (const s of c.segments) expect(Number.isFinite(s.x0 + s.y0)).toBe(true);
      }),
      { seed: 42, numRuns: 400 },
    );
    fc.assert(fc.property(fc.string(), (text) => { read(text); }), { seed: 42, numRuns: 200 });
  });
});
