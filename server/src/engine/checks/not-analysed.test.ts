import { describe, expect, it } from 'vitest';
import { dxf } from '../../../../test/support/dxfText';
import { analyze } from '../index';

describe('not-analysed', () => {
  it('is silent for a drawing of outlines only', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '10', 0, '20', 0, '40', 1]), 'dxf');
    expect(r.findings.filter((f) => f.checkId === 'not-analysed')).toEqual([]);
  });

  it('lists MTEXT and DIMENSION entities once per type, as information', () => {
    const r = analyze(dxf(['0', 'MTEXT', '8', 'CUT', '1', 'a'], ['0', 'MTEXT', '8', 'CUT', '1', 'b'], ['0', 'DIMENSION', '8', 'CUT']), 'dxf');
    const f = r.findings.filter((x) => x.checkId === 'not-analysed');
    expect(f.map((x) => [x.severity, x.message])).toEqual([
      ['info', 'Not analysed: MTEXT (2 entities; not cutting outlines).'],
      ['info', 'Not analysed: DIMENSION (1 entity; not cutting outlines).'],
    ]);
  });

  /** A LAYER table (DXF Reference, TABLES section: LAYER group 70 bit 1 = frozen, negative colour 62 = off; REFERENCES.md §6.2). */
  const layerTable = (...layers: [name: string, flags: number, colour: number][]): (string | number)[] =>
    ['0', 'SECTION', '2', 'TABLES', '0', 'TABLE', '2', 'LAYER', ...layers.flatMap(([n, f, c]) => ['0', 'LAYER', '2', n, '70', f, '62', c]), '0', 'ENDTAB', '0', 'ENDSEC'];
  const withTables = (tables: (string | number)[], ...entities: (string | number)[][]) =>
    dxf(...entities).replace('0\nSECTION\n2\nENTITIES\n', `${tables.join('\n')}\n0\nSECTION\n2\nENTITIES\n`);
  const circle = (layer: string, r: number) => ['0', 'CIRCLE', '8', layer, '10', 0, '20', 0, '40', r];

  it('skips entities on frozen and switched-off layers by default and lists each layer at its table entry', () => {
    const text = withTables(layerTable(['CUT', 0, 7], ['NOTES', 1, 7], ['HIDDEN', 0, -5]), circle('CUT', 1), circle('NOTES', 2), circle('HIDDEN', 3), circle('HIDDEN', 4));
    const r = analyze(text, 'dxf');
    expect(r.contours.map((c) => c.contour.layer)).toEqual(['CUT']);
    const f = r.findings.filter((x) => x.checkId === 'not-analysed');
    expect(f.map((x) => x.message)).toEqual([
      'Layer NOTES is frozen: 1 entity not analysed.',
      'Layer HIDDEN is off: 2 entities not analysed.',
    ]);
    expect(text.slice(f[0].span.start, f[0].span.end)).toMatch(/^0\nLAYER\n2\nNOTES\n/);
  });

  it('skips the layers named in ignoredLayers, whatever their case, also inside blocks', () => {
    const block = ['0', 'SECTION', '2', 'BLOCKS', '0', 'BLOCK', '2', 'MARK', '10', 0, '20', 0, ...circle('Engrave', 1), '0', 'ENDBLK', '0', 'ENDSEC'];
    const text = withTables(block, circle('CUT', 5), circle('ENGRAVE', 2), ['0', 'INSERT', '8', 'CUT', '2', 'MARK', '10', 20, '20', 0]);
    const r = analyze(text, 'dxf', { ignoredLayers: ['engrave'] });
    expect(r.contours.map((c) => c.contour.layer)).toEqual(['CUT']);
    const f = r.findings.filter((x) => x.checkId === 'not-analysed');
    expect(f.map((x) => x.message)).toEqual(['Layer ENGRAVE is ignored by the settings: 1 entity not analysed.', 'Layer Engrave is ignored by the settings: 1 entity not analysed.']);
    expect(f[0].severity).toBe('info');
    // Without the setting both engraving circles are outlines.
    expect(analyze(text, 'dxf').contours).toHaveLength(3);
  });

  it('lists paper-space entities (group 67 = 1) and leaves them out', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '67', 1, '10', 0, '20', 0, '40', 1]), 'dxf');
    expect(r.contours).toEqual([]);
    expect(r.findings.map((x) => x.messageId)).toEqual(['paperSpace']);
  });
});
