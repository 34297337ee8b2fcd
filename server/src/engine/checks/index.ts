/** The registry of checks: id → definition. A new check is added here and documented in the README. */
import branching from './branching';
import contoursCross from './contours-cross';
import type { CheckDefinition } from './defineCheck';
import degenerateArea from './degenerate-area';
import doubleCut from './double-cut';
import duplicateEntity from './duplicate-entity';
import nearClosed from './near-closed';
import notAnalysed from './not-analysed';
import openContour from './open-contour';
import outOfPlane from './out-of-plane';
import parseError from './parse-error';
import searchStopped from './search-stopped';
import selfCrossing from './self-crossing';
import selfTouch from './self-touch';
import unitsAssumed from './units-assumed';
import zeroLengthSegment from './zero-length-segment';

export type { CheckContext, CheckDefinition } from './defineCheck';

/** Every check, in the order they run. */
export const checks: readonly CheckDefinition[] = [parseError, unitsAssumed, openContour, nearClosed, zeroLengthSegment,
  notAnalysed, outOfPlane, branching, duplicateEntity, selfCrossing, selfTouch, contoursCross, doubleCut, searchStopped, degenerateArea];

const byId = new Map(checks.map((c) => [c.id, c]));

/** The check with this id; throws for an unknown id (a reader or check reporting under a wrong id is a bug). */
export function getCheck(id: string): CheckDefinition {
  const check = byId.get(id);
  if (!check) throw new Error(`Unknown check id '${id}'; known ids: ${[...byId.keys()].join(', ')}`);
  return check;
}
