import { checkCases } from '../../../../test/support/checkCases';
import nearClosed from './near-closed';

// Closedness per SVG 2 Paths, "The closepath command"; the fix follows REFERENCES.md §5.4 (move the
// last point onto the first, then append Z, so no sliver remains). Gaps are Euclidean distances in mm.
checkCases(nearClosed, {
  valid: [
    { name: 'a square closed with Z', svg: '<path d="M0 0H10V10H0Z"/>' },
    { name: 'a rectangle element (closed by definition)', svg: '<rect width="10" height="5"/>' },
    { name: 'a gap wider than the tolerance (reported as open-contour instead)', svg: '<path d="M0 0H10V10H0V2"/>' },
  ],
  invalid: [
    {
      name: 'an end 0.05 mm short of the start, with a fix that moves it there and adds Z',
      svg: '<path d="M0 0H10V10H0V0.05"/>',
      findings: [{ messageId: 'gap', at: 'V0.05', data: { gapMm: 0.05, toleranceMm: 0.1, contour: 0 } }],
      fixed: '<path d="M0 0H10V10H0V0Z"/>',
    },
    {
      name: 'an end exactly on the start without Z, fixed by adding Z',
      svg: '<path d="M0 0 L10 0 L10 10 L0 0"/>',
      findings: [{ messageId: 'touching', at: 'L0 0', data: { gapMm: 0 } }],
      fixed: '<path d="M0 0 L10 0 L10 10 L0 0Z"/>',
    },
    {
      name: 'a polyline whose last point is 0.06 mm from its first (hypot 0.036, 0.048 = 0.06)',
      svg: '<polyline points="0,0 10,0 10,10 0.036,0.048"/>',
      findings: [{ messageId: 'gap', at: '0.036,0.048', data: { gapMm: 0.06 } }],
    },
    {
      name: 'a gap of 0.5 mm when the user widens the tolerance to 1 mm',
      svg: '<path d="M0 0H10V10H0V0.5"/>',
      options: { nearClosedToleranceMm: 1 },
      findings: [{ messageId: 'gap', at: 'V0.5', data: { gapMm: 0.5, toleranceMm: 1 } }],
      fixed: '<path d="M0 0H10V10H0V0Z"/>',
    },
  ],
});
