import { getSegmentEnd } from '../../geometry/bounds';
import type { Fix, Segment, SourceSpan, TextEdit } from '../../types';

/**
 * The "close this subpath" quick fix for SVG path data (REFERENCES §5.4: append Z, or move the last
 * point onto the first and append Z). The edits keep every other part of the path where it was:
 * - only the last argument group's end coordinates change (or that one group is replaced by an
 *   equivalent absolute command when rewriting its numbers cannot reach the start exactly);
 * - a relative `m` right after the subpath is rewritten to absolute values, because after the fix
 *   the point it is relative to has moved (SVG 2 Paths, "The closepath command": after Z the current
 *   point is the subpath's initial point).
 * Numbers are written with String(n), the shortest text that reads back as the same double
 * (ECMAScript Number::toString), so a re-read gives exactly the intended coordinates.
 */

/** Upper-case letter of the command an argument group belongs to (an implicit lineto after M is 'L'). */
export type DrawCommand = 'L' | 'H' | 'V' | 'C' | 'S' | 'Q' | 'T' | 'A';

/** The last argument group of a subpath, as read. Offsets are local to the `d` text. */
export interface ArgumentGroup {
  readonly command: DrawCommand;
  readonly relative: boolean;
  /** The group's text, with its command letter when it is the command's first group. */
  readonly start: number;
  readonly end: number;
  /** Arguments as written (arc flags as 0/1) and the offsets of their text. */
  readonly args: readonly number[];
  readonly tokenStarts: readonly number[];
  readonly tokenEnds: readonly number[];
  /** Current point before the group, user units. */
  readonly x0: number;
  readonly y0: number;
}

/** A relative moveto directly after the subpath. Offsets are local to the `d` text. */
export interface FollowingMoveto {
  /** Offset of the `m`. */
  readonly letterStart: number;
  /** End of its first coordinate pair. */
  readonly pairEnd: number;
  /** Start of the first implicit lineto pair after it, or −1 when none follows. */
  readonly restStart: number;
  /** The absolute point it moves to, user units. */
  readonly x: number;
  readonly y: number;
}

const TITLE_ADD_Z = 'Close the contour (add Z)';
const TITLE_MOVE_AND_Z = 'Close the contour (move the end onto the start and add Z)';

/**
 * Edits (file offsets; `base` is the file offset of `d[0]`) that close an open subpath with no
 * sliver: insert Z when its end already is its start, otherwise move the end onto the start first.
 * (sx, sy) is the subpath's start and `last` its last segment, both in user units as read.
 */
export function getCloseFix(
  d: string,
  base: number,
  sx: number,
  sy: number,
  last: Segment,
  group: ArgumentGroup,
  next: FollowingMoveto | null,
): Fix {
  const [ex, ey] = getSegmentEnd(last);
  const at = (start: number, end: number): SourceSpan => ({ start: base + start, end: base + end });
  if (ex === sx && ey === sy) {
    return { title: TITLE_ADD_Z, edits: [{ span: at(group.end, group.end), newText: 'Z' }] };
  }
  const edits: TextEdit[] = [getMoveEndEdit(d, sx, sy, group, last, at)];
  if (next !== null) {
    const hasRest = next.restStart >= 0;
    edits.push({
      span: at(next.letterStart, hasRest ? next.restStart : next.pairEnd),
      // Further pairs of the `m` stay relative implicit linetos: an explicit `l` keeps them so.
      newText: `M${fmt(next.x)} ${fmt(next.y)}${hasRest ? 'l' : ''}`,
    });
  }
  return { title: TITLE_MOVE_AND_Z, edits };
}

/** Shortest round-trip text of a number (never "-0"). */
function fmt(n: number): string {
  return String(n);
}

/** The edit that puts the group's end point on (sx, sy) and appends Z. */
function getMoveEndEdit(
  d: string, sx: number, sy: number, group: ArgumentGroup, last: Segment,
  at: (start: number, end: number) => SourceSpan,
): TextEdit {
  const { command, relative, x0, y0, tokenStarts, tokenEnds } = group;
  const rewrite = (tokenFrom: number, tokenTo: number, text: string): TextEdit => {
    const start = tokenStarts[tokenFrom]!;
    // Keep the new first number from running into a number written just before it (`-4` + `7`).
    // String(n) starts with a digit or '-', never '.'; a '-' always starts a new number.
    const before = start > 0 ? d.charCodeAt(start - 1) : -1;
    const glue = text[0] !== '-' && ((before >= 48 && before <= 57) || before === 46) ? ' ' : '';
    return { span: at(start, tokenEnds[tokenTo]!), newText: `${glue}${text}Z` };
  };
  if (command === 'H') {
    const vx = relative ? sx - x0 : sx;
    if (y0 === sy && (!relative || x0 + vx === sx)) return rewrite(0, 0, fmt(vx));
  } else if (command === 'V') {
    const vy = relative ? sy - y0 : sy;
    if (x0 === sx && (!relative || y0 + vy === sy)) return rewrite(0, 0, fmt(vy));
  } else {
    const ix = group.args.length - 2;
    const vx = relative ? sx - x0 : sx;
    const vy = relative ? sy - y0 : sy;
    if (!relative || (x0 + vx === sx && y0 + vy === sy)) return rewrite(ix, ix + 1, `${fmt(vx)} ${fmt(vy)}`);
  }
  return { span: at(group.start, group.end), newText: `${getAbsoluteCommand(sx, sy, group, last)}Z` };
}

/**
 * The group as an absolute command ending at (sx, sy). Control points are the ones already read, so
 * they read back as the same doubles (an S or T becomes the equivalent C or Q: it is the subpath's
 * last command, so no later S/T reflects it).
 */
function getAbsoluteCommand(sx: number, sy: number, group: ArgumentGroup, last: Segment): string {
  const end = `${fmt(sx)} ${fmt(sy)}`;
  if (group.command === 'A') {
    const [rx, ry, rotation, largeArc, sweep] = group.args;
    return `A${fmt(rx!)} ${fmt(ry!)} ${fmt(rotation!)} ${largeArc} ${sweep} ${end}`;
  }
  switch (last.kind) {
    case 'cubic': return `C${fmt(last.x1)} ${fmt(last.y1)} ${fmt(last.x2)} ${fmt(last.y2)} ${end}`;
    case 'quad': return `Q${fmt(last.x1)} ${fmt(last.y1)} ${end}`;
    default:
      if (group.command === 'H' && group.y0 === sy) return `H${fmt(sx)}`;
      if (group.command === 'V' && group.x0 === sx) return `V${fmt(sy)}`;
      return `L${end}`;
  }
}
