/**
 * The catalogue of numeric tolerances: one constant per kind of quantity, with its unit, whether it
 * is absolute or relative, why it has this size and where the value comes from. Tolerances set
 * user-facing thresholds and stop iterations; signs (orientation, crossing) are decided exactly.
 */

/** Largest end-to-start gap still reported as `near-closed` (likely meant to be closed) rather than
 *  `open-contour`, when the user sets nothing.
 *  Quantity: length · Unit: mm · Absolute (machines position absolutely).
 *  Source: common practice, no source (people treat 0.01–0.1 mm as closed; we take the top of that
 *  range so a visibly-unclosed joint is still caught as near-closed). */
export const DEFAULT_NEAR_CLOSED_TOLERANCE_MM = 0.1;

/** A segment shorter than this is reported as `zero-length-segment`.
 *  Quantity: length · Unit: mm · Absolute. Far below any machine's resolution (~1 µm steps), far above
 *  rounding noise of coordinates converted to mm (~1e-13 mm for drawings under 1 m).
 *  Source: common practice, no source. */
export const ZERO_LENGTH_MM = 1e-6;
