import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { parseNumberList } from './numbers';
import { getDeclaredEntities, getPositionedValue, scanDocument, type SvgElement } from './scan';

describe('scanDocument', () => {
  it("finds raw attribute value spans with '>' in values, single quotes, CRLF and spaces around '=' (XML 1.0 [40]-[41])", () => {
    const text = "<svg>\r\n<path  d = 'M0 0 > L1 1'\r\n id=\"a&amp;b\" /></svg>";
    const { root, byId, error } = scanDocument(text);
    expect(error).toBeNull();
    const path = root!.children[0]!;
    expect(text.slice(path.tagSpan.start, path.tagSpan.end)).toBe("<path  d = 'M0 0 > L1 1'\r\n id=\"a&amp;b\" />");
    const d = path.attributes.get('d')!;
    expect(text.slice(d.span.start, d.span.end)).toBe('M0 0 > L1 1');
    const id = path.attributes.get('id')!;
    expect(id.value).toBe('a&b');
    expect(text.slice(id.span.start, id.span.end)).toBe('a&amp;b');
    expect(byId.get('a&b')).toBe(path);
  });

  it('maps each decoded character of a value with references back to its raw offset', () => {
    const text = '<svg><path d="1&#x20;2&amp;3"/></svg>';
    const { root, entities } = scanDocument(text);
    const attr = root!.children[0]!.attributes.get('d')!;
    const { value, offsets } = getPositionedValue(text, attr, entities);
    expect(value).toBe('1 2&3');
    const start = attr.span.start;
    expect(Array.from(offsets!).map((o) => o - start)).toEqual([0, 1, 7, 8, 13, 14]);
  });

  it('reads general entities from an internal subset and skips parameter entities (XML 1.0 §4.2)', () => {
    expect(getDeclaredEntities('svg [ <!ENTITY a "x"> <!ENTITY % p "y"> <!ENTITY b \'z\'> ]')).toEqual({ a: 'x', b: 'z' });
  });
});

describe('parseNumberList', () => {
  it('splits numbers without separators where the grammar allows: 100-200, 0.6.5, 1e2, -.5e-1 (REFERENCES §5.1)', () => {
    expect(parseNumberList('100-200 0.6.5 1e2,-.5e-1').numbers.map((n) => n.value)).toEqual([100, -200, 0.6, 0.5, 100, -0.05]);
  });

  it('stops at a bad token or a double comma and keeps what came before (SVG 2 Basic Shapes error handling)', () => {
    expect(parseNumberList('1,2 3x 4')).toMatchObject({ numbers: [{ value: 1 }, { value: 2 }, { value: 3 }], error: { start: 5, end: 6 } });
    expect(parseNumberList('1,,2').error).toMatchObject({ start: 2, detail: 'two commas in a row' });
    expect(parseNumberList('1 2,').error).toMatchObject({ start: 3 });
    expect(parseNumberList('1e 2').error).toMatchObject({ start: 1 });
  });
});

/** What saxes itself (the npm reference parser) makes of a document read in one piece. */
function readWithSaxes(text: string): { attributes: Record<string, string>[]; tagEnds: number[]; errorAt: number | null } {
  const parser = new SaxesParser({ position: true });
  const attributes: Record<string, string>[] = [];
  const tagEnds: number[] = [];
  let errorAt: number | null = null;
  parser.on('opentag', (tag) => {
    attributes.push(tag.attributes as Record<string, string>);
    tagEnds.push(parser.position);
  });
  parser.on('error', () => {
    errorAt ??= parser.position;
  });
  parser.write(text).close();
  return { attributes, tagEnds, errorAt };
}

function getElements(root: SvgElement | null): SvgElement[] {
  return root ? [root, ...root.children.flatMap(getElements)] : [];
}

describe('scanDocument with long attribute values (kept from saxes, checked here)', () => {
  const long = Array.from({ length: 600 }, (_, i) => `${i % 7 === 0 ? '\r\n' : i % 5 === 0 ? '\t' : ' '}C${i} ${-i}.5 ${i}e1 1 2 3`).join('');

  it('gives the values, spans and tag ends saxes gives for the whole text (reference: saxes in one piece)', () => {
    const text = `<svg><path id="a" d="${long}"/><g><path d = \n'${long}' x="1"></path></g><path d="${long}" title="${long}"/></svg>`;
    const scanned = scanDocument(text);
    const reference = readWithSaxes(text);
    expect(scanned.error).toBeNull();
    const elements = getElements(scanned.root);
    expect(elements.map((e) => e.tagSpan.end)).toEqual(reference.tagEnds);
    elements.forEach((element, i) => {
      expect(Object.fromEntries([...element.attributes].map(([name, a]) => [name, a.value]))).toEqual(reference.attributes[i]);
      for (const a of element.attributes.values()) expect(text.slice(a.span.start, a.span.end).replace(/\r\n?|[\t\n]/g, ' ')).toBe(a.value);
    });
  });

  it("reads a long run inside another value (title='a=\"…\"') as saxes does (reference: saxes in one piece)", () => {
    const text = `<svg><path title='a="${long}"' d="M0 0 L1 1"/></svg>`;
    const path = scanDocument(text).root!.children[0]!;
    expect(path.attributes.get('title')!.value).toBe(readWithSaxes(text).attributes[1]!['title']);
    expect(path.attributes.get('d')!.value).toBe('M0 0 L1 1');
  });

  it('reports an error after a long value where saxes does (reference: saxes in one piece)', () => {
    for (const text of [`<svg><path d="${long}" x></svg>`, `<svg><path d="${long}"/>`, `<svg><path d="${long}`]) {
      const { error } = scanDocument(text);
      expect(error).not.toBeNull();
      const at = readWithSaxes(text).errorAt!;
      expect(error!.span.end === at || error!.detail.startsWith('unclosed tag')).toBe(true);
    }
  });
});
