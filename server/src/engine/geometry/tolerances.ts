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

/** Guaranteed accuracy of a Bézier segment's length (Gauss–Legendre panels, see length.ts
 *  BezierLengthIntegrator): the panels' a-priori error bounds add up to at most this fraction of the
 *  length (rounding aside, ~1e-15), unless the quadrature reports that it hit BEZIER_LENGTH_MAX_DEPTH.
 *  Quantity: length · Unit: none · Relative (to the segment's length).
 *  Why this size: 1e-9 of a 1 m contour is 1 nm, far below any cutter's resolution, while one 4- or
 *  8-point panel meets it on smooth curves (REFERENCES §4.5: one 16-point panel gives ~1e-14).
 *  Source: common practice, no source. */
export const BEZIER_LENGTH_REL_TOL = 1e-9;

/** Iteration cap: deepest bisection of a Bézier (or short elliptical arc) length panel (at most 2^20
 *  panels along one path of the recursion). Reaching it is reported (`depthCapped`) and the best
 *  estimate so far is returned. Why this size: smooth integrands converge after a few levels; only a
 *  near-cusp (|B′| nearly 0, not split off exactly) recurses further, and 2^-20 of the parameter
 *  range isolates it.
 *  Source: REFERENCES §4.5 (QUADPACK-style adaptive scheme, "depth limit ~20"). */
export const BEZIER_LENGTH_MAX_DEPTH = 20;

/** Stopping tolerance r of Carlson's duplication algorithms for R_F and R_D (ellipticIntegrals.ts):
 *  the neglected series terms are below r relative.
 *  Quantity: elliptic integral · Unit: none · Relative. 2^-53 = 1.1102230246251565e-16 (double
 *  precision unit roundoff), so the series error is below rounding.
 *  Source: B. C. Carlson, Numer. Algorithms 10 (1995) 13–26, §§2–3 (error bound in terms of r). */
export const CARLSON_REL_TOL = 2 ** -53;

/** Target accuracy of the length of an elliptical arc shorter than a quarter turn, integrated by the
 *  adaptive 16-point Gauss–Legendre scheme (length.ts, `refine`, from getArcLengthEstimate).
 *  Quantity: length · Unit: none · Relative. Why this size: longer arcs are measured through elliptic
 *  integrals to ~1e-15; 1e-13 keeps short arcs nearly as exact at a few panels (the integrand is
 *  analytic) while staying well above the rounding noise of the 16-point sums (~1e-16 per panel).
 *  Source: common practice, no source. */
export const ARC_LENGTH_QUADRATURE_REL_TOL = 1e-13;

/** Largest distance between two entity ends that are joined when loose DXF entities are chained
 *  into contours; ends farther apart stay open (and the gap is then reported by `near-closed` or
 *  `open-contour`). Quantity: length · Unit: mm · Absolute. Why this size: coordinates written with
 *  3 decimals in mm or 4 decimals in inches are off by up to 1.3 µm each, so two ends meant to meet
 *  can be ~3 µm apart; 5 µm joins them and stays below the resolution of cutting machines (~10 µm).
 *  Source: common practice, no source. */
export const CHAIN_TOLERANCE_MM = 0.005;

/** Largest deviation of the cubic Béziers that replace a spline piece with no exact form in our
 *  segment kinds (degree > 3, or rational and not a conic arc), measured as the parametric distance
 *  at 15 interior points of every piece. Quantity: length · Unit: mm · Absolute. Far below machine
 *  resolution (~10 µm) and far above rounding noise. Source: common practice, no source. */
export const SPLINE_FIT_TOLERANCE_MM = 1e-4;

/** An extrusion direction (normalised) counts as parallel to ±Z when |Nx| and |Ny| are below this;
 *  otherwise the entity leaves the drawing plane. Quantity: direction cosine · Unitless · Absolute.
 *  Far above rounding noise of a unit vector written with ~15 digits, far below the 1/64 threshold of
 *  the arbitrary axis algorithm (REFERENCES.md §6.5). Source: common practice, no source. */
export const PLANE_NORMAL_TOLERANCE = 1e-9;
