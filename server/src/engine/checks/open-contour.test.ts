import { checkCases } from '../../../../test/support/checkCases';
import openContour from './open-contour';

// Closedness per SVG 2 Paths, "The closepath command": a subpath is closed only by Z/z.
// Gaps are Euclidean distances in mm (the wrapper makes one user unit 1 mm).
checkCases(openContour, {
  valid: [
    { name: 'a square closed with Z', svg: '<path d="M0 0H10V10H0Z"/>' },
    { name: 'a polygon (always closed, SVG 2 Basic Shapes)', svg: '<polygon points="0,0 10,0 10,10"/>' },
    { name: 'a gap within the near-closed tolerance (reported as near-closed instead)', svg: '<path d="M0 0H10V10H0V0.05"/>' },
    { name: 'a lone moveto (nothing is drawn)', svg: '<path d="M5 5"/>' },
  ],
  invalid: [
    {
      name: 'a path whose end is 3-4-5 away from its start (gap 5 mm, Pythagoras)',
      svg: '<path d="M0 0 L20 0 L20 20 L3 4"/>',
      findings: [{ messageId: 'gap', at: 'L3 4', data: { gapMm: 5, contour: 0 } }],
    },
    {
      name: 'a line element (open by definition, SVG 2 Basic Shapes)',
      svg: '<line x1="0" y1="0" x2="0" y2="30"/>',
      findings: [{ messageId: 'gap', at: '<line x1="0" y1="0" x2="0" y2="30"/>', data: { gapMm: 30 } }],
    },
    {
      name: 'the second subpath only, at its own last command',
      svg: '<path d="M0 0h10v10h-10z M50 50 h10 v10"/>',
      findings: [{ messageId: 'gap', at: 'v10', data: { contour: 1, gapMm: Math.hypot(10, 10) } }],
    },
    {
      name: 'a gap just over a user tolerance of 0.01 mm',
      svg: '<path d="M0 0H10V10H0V0.02"/>',
      options: { nearClosedToleranceMm: 0.01 },
      findings: [{ messageId: 'gap', at: 'V0.02', data: { gapMm: 0.02 } }],
    },
  ],
});
