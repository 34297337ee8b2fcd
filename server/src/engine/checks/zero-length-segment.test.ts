import { checkCases } from '../../../../test/support/checkCases';
import zeroLengthSegment from './zero-length-segment';

// A segment whose end equals its start has length 0 (Euclidean distance); an arc whose end points
// coincide is omitted by SVG renderers (SVG 1.1 F.6.2) and still marks a pause for a machine.
checkCases(zeroLengthSegment, {
  valid: [
    { name: 'a square without repeated points', svg: '<path d="M0 0H10V10H0Z"/>' },
    { name: 'a full circle element', svg: '<circle cx="5" cy="5" r="5"/>' },
    // A cubic loop whose ends meet: its length is about 20.4 mm (a 1e6-chord polyline, computed once), not 0.
    { name: 'a cubic whose ends meet but which loops', svg: '<path d="M0 0 C10 10 -10 10 0 0 H10 V10 Z"/>' },
  ],
  invalid: [
    {
      name: 'a repeated point in the middle of a path',
      svg: '<path d="M0 0 L10 0 L10 0 L10 10Z"/>',
      findings: [{ messageId: 'zero', at: 'L10 0', data: { lengthMm: 0, contour: 0 } }],
    },
    {
      name: 'a relative lineto of zero',
      svg: '<path d="M0 0 h10 l0,0 v10 z"/>',
      findings: [{ messageId: 'zero', at: 'l0,0', data: { lengthMm: 0 } }],
    },
    {
      name: 'a quadratic whose control points all coincide',
      svg: '<path d="M0 0 H10 Q10 0 10 0 V10 Z"/>',
      findings: [{ messageId: 'zero', at: 'Q10 0 10 0', data: { lengthMm: 0 } }],
    },
    {
      name: 'an arc that ends where it starts',
      svg: '<path d="M0 0 H10 A5 5 0 0 1 10 0 V10 Z"/>',
      findings: [{ messageId: 'zero', at: 'A5 5 0 0 1 10 0', data: { lengthMm: 0 } }],
    },
  ],
});
