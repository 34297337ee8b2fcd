/**
 * The DXF benchmark's input and floor, shared by dxf.bench.ts and the peak-memory child (dxfPeakRss.ts).
 */

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
