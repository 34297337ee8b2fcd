/**
 * Runs an SVG snippet (1 user unit = 1 mm, see `wrapSvg`) through the whole analysis and returns one
 * check's findings with the text each covers and the texts of their related places.
 */
import { analyze } from '../../server/src/engine/index';
import type { CheckDefinition } from '../../server/src/engine/checks/index';
import { wrapSvg } from './checkCases';

export function runCheck(check: CheckDefinition, svg: string) {
  const text = wrapSvg(svg);
  return analyze(text, 'svg').findings
    .filter((f) => f.checkId === check.id)
    .map((f) => ({
      messageId: f.messageId,
      at: text.slice(f.span.start, f.span.end),
      data: f.data,
      related: f.related?.map((r) => text.slice(r.span.start, r.span.end)),
    }));
}
