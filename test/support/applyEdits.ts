import type { TextEdit } from '../../server/src/engine/types';

/** Applies non-overlapping edits to a text (all spans refer to the original text). */
export function applyEdits(text: string, edits: readonly TextEdit[]): string {
  const sorted = [...edits].sort((a, b) => b.span.start - a.span.start || b.span.end - a.span.end);
  let out = text;
  let limit = Infinity;
  for (const e of sorted) {
    if (e.span.end > limit) throw new Error(`Overlapping edits at ${e.span.start}–${e.span.end}`);
    out = out.slice(0, e.span.start) + e.newText + out.slice(e.span.end);
    limit = e.span.start;
  }
  return out;
}
