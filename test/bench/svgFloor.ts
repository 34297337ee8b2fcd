/**
 * The SVG benchmarks' floor: what any reader of the file must at least do. The XML is parsed with
 * saxes and every number in the chosen attributes of every element is scanned and converted (no model,
 * no geometry). Shared by geometry.bench.ts (the path data only) and parts.bench.ts (every attribute).
 */
import { SaxesParser } from 'saxes';

/** Parses `text` and sums the numbers in the attributes named (all attributes when none are). */
export function svgFloor(text: string, attributes?: readonly string[]): number {
  let sum = 0;
  const parser = new SaxesParser();
  parser.on('opentag', (tag) => {
    for (const name of attributes ?? Object.keys(tag.attributes)) {
      const value = tag.attributes[name];
      if (typeof value !== 'string') continue;
      const re = /-?\d*\.?\d+(?:e-?\d+)?/g;
      let m: RegExpExecArray | null;
      while ((m = re.exec(value))) sum += Number(m[0]);
    }
  });
  parser.write(text).close();
  return sum;
}
