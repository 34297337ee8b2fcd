/**
 * Number formatting shared by messages, the hover card and the CLI, so a figure reads the same
 * everywhere. Lengths and areas keep at least four significant digits and never switch to
 * exponent notation for the sizes a cutting table handles.
 */

/** Formats a finite number for people: up to `digits` decimals, trailing zeros trimmed, small values to 3 significant digits. */
export function formatNumber(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const abs = Math.abs(v);
  let s: string;
  if (abs >= 10 ** -digits) s = v.toFixed(digits);
  else if (abs >= 1e-9) s = v.toPrecision(3);
  else return v.toExponential(2);
  if (s.includes('.') && !s.includes('e')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

/**
 * Replaces `{name}` in a template by the formatted value of `data[name]`, and `{name|one|many}` by the
 * number followed by the word that agrees with it ("1 entity", "2 entities").
 */
export function fillTemplate(template: string, data: Readonly<Record<string, string | number | boolean>>): string {
  return template.replace(/\{(\w+)(?:\|([^|}]*)\|([^|}]*))?\}/g, (whole, name: string, one?: string, many?: string) => {
    const v = data[name];
    if (v === undefined) return whole;
    const text = typeof v === 'number' ? formatNumber(v) : String(v);
    return one === undefined ? text : `${text} ${v === 1 ? one : many}`;
  });
}
