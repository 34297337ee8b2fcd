/**
 * Number formatting shared by messages, the hover card and the CLI, so a figure reads the same
 * everywhere. Lengths and areas keep at least four significant digits and never switch to
 * exponent notation for the sizes a cutting table handles.
 */

/** `s` without trailing zeros after its decimal point, nor a bare point (callers pass fixed notation only). */
function trimZeros(s: string): string {
  let end = s.length;
  while (s.charCodeAt(end - 1) === 48 /* 0 */) end--;
  if (s.charCodeAt(end - 1) === 46 /* . */) end--;
  return end === s.length ? s : s.slice(0, end);
}

/** Formats a finite number for people: up to `digits` decimals, trailing zeros trimmed, small values to 3 significant digits. */
export function formatNumber(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  // A safe integer's fixed notation, zeros trimmed, is String's (beyond 2^53 toFixed writes the
  // exact binary value where String writes the shortest round-trip digits).
  if (Number.isSafeInteger(v)) return String(v);
  const abs = Math.abs(v);
  let s: string;
  if (abs >= 10 ** -digits) s = v.toFixed(digits);
  else if (abs >= 1e-9) s = v.toPrecision(3);
  else return v.toExponential(2);
  if (s.includes('.') && !s.includes('e')) s = trimZeros(s);
  return s === '-0' ? '0' : s;
}

const PLACEHOLDER = /\{(\w+)(?:\|([^|}]*)\|([^|}]*))?\}/g;

/** A placeholder of a template: `{name}`, or `{name|one|many}` when `one` is set. */
interface Slot {
  /** Its position in `CompiledTemplate.parts`. */
  readonly at: number;
  readonly name: string;
  readonly one: string | undefined;
  readonly many: string | undefined;
  /** The placeholder as written, kept when the data has no such name. */
  readonly whole: string;
}

/**
 * A template cut once into its literal text and its placeholders. `parts` holds the literal pieces
 * and is the buffer a message is joined from (a join makes one flat string; `+` would keep a rope of
 * cons cells per message, about twice the memory of the text).
 */
interface CompiledTemplate {
  readonly parts: string[];
  readonly slots: readonly Slot[];
}

/** Compiled templates by text; the templates are the checks' messages, a few dozen at most. */
const compiled = new Map<string, CompiledTemplate>();

function compile(template: string): CompiledTemplate {
  const parts: string[] = [];
  const slots: Slot[] = [];
  let last = 0;
  for (const m of template.matchAll(PLACEHOLDER)) {
    parts.push(template.slice(last, m.index));
    slots.push({ at: parts.length, name: m[1]!, one: m[2], many: m[3], whole: m[0] });
    parts.push(m[0]);
    last = m.index + m[0].length;
  }
  parts.push(template.slice(last));
  return { parts, slots };
}

/**
 * Replaces `{name}` in a template by the formatted value of `data[name]`, and `{name|one|many}` by the
 * number followed by the word that agrees with it ("1 entity", "2 entities").
 */
export function fillTemplate(template: string, data: Readonly<Record<string, string | number | boolean>>): string {
  let t = compiled.get(template);
  if (t === undefined) compiled.set(template, (t = compile(template)));
  const { parts, slots } = t;
  if (slots.length === 0) return template;
  for (let i = 0; i < slots.length; i++) {
    const slot = slots[i]!;
    const v = data[slot.name];
    let text: string;
    if (v === undefined) text = slot.whole;
    else {
      text = typeof v === 'number' ? formatNumber(v) : String(v);
      if (slot.one !== undefined) text = `${text} ${v === 1 ? slot.one : slot.many}`;
    }
    parts[slot.at] = text;
  }
  return parts.join('');
}
