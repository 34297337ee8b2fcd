/**
 * Drawing units of a DXF file: the $INSUNITS header variable to millimetres per drawing unit.
 */
import type { AssumedUnit, RawFinding, SourceSpan, UnitsInfo } from '../../types';

/**
 * Millimetres per unit for each $INSUNITS code, index = code.
 * Source: REFERENCES.md §6.3 (DXF Reference / INSUNITS, codes 0–20, factors from SI/IAU definitions).
 * Codes 21–24 (US survey foot, inch, yard, mile) added in later releases: 1 US survey foot = 1200/3937 m
 * (from memory, NIST definition; §6.3 gives 21 = 304.8006096012192 mm).
 */
export const INSUNITS_MM: readonly (number | null)[] = [
  null, // 0 unitless / unspecified
  25.4, // 1 inch
  304.8, // 2 foot
  1609344, // 3 mile
  1, // 4 millimetre
  10, // 5 centimetre
  1000, // 6 metre
  1e6, // 7 kilometre
  2.54e-5, // 8 microinch
  0.0254, // 9 mil
  914.4, // 10 yard
  1e-7, // 11 ångström
  1e-6, // 12 nanometre
  1e-3, // 13 micron
  100, // 14 decimetre
  1e4, // 15 decametre
  1e5, // 16 hectometre
  1e12, // 17 gigametre
  1.495978707e14, // 18 astronomical unit
  9.4607304725808e18, // 19 light year
  3.085677581491367e19, // 20 parsec
  1_200_000 / 3937, // 21 US survey foot
  100_000 / 3937, // 22 US survey inch
  3_600_000 / 3937, // 23 US survey yard
  6_336_000_000 / 3937, // 24 US survey mile
];

/** Millimetres per unit a user may assume; `auto` means millimetres for DXF (the fabrication default, §6.3). */
const ASSUMED_MM: Readonly<Record<AssumedUnit, number>> = {
  auto: 1,
  mm: 1,
  cm: 10,
  in: 25.4,
  pt: 25.4 / 72, // CSS Values and Units Level 3: 1pt = 1/72 in
  px: 25.4 / 96, // CSS Values and Units Level 3: 1px = 1/96 in
};

/**
 * Unit information from $INSUNITS. `declaration` is the header variable (value and span) when present,
 * `headerSpan` where a declaration would go. An unknown code is reported and treated as undeclared.
 */
export function getDxfUnits(
  declaration: { readonly value: number; readonly span: SourceSpan } | undefined,
  headerSpan: SourceSpan | undefined,
  assumedUnit: AssumedUnit,
  problems: RawFinding[],
): UnitsInfo {
  if (declaration && Number.isInteger(declaration.value) && declaration.value > 0) {
    const mm = INSUNITS_MM[declaration.value];
    if (mm != null) return { declared: true, mmPerUnit: mm, assumed: null, span: declaration.span };
    problems.push({
      checkId: 'parse-error', messageId: 'value', span: declaration.span,
      data: { attribute: '$INSUNITS', detail: `unit code ${declaration.value} is not defined (0–24 are)` },
    });
  }
  const assumed = assumedUnit === 'auto' ? 'mm' : assumedUnit;
  return {
    declared: false,
    mmPerUnit: ASSUMED_MM[assumedUnit],
    assumed,
    span: declaration?.span ?? headerSpan ?? { start: 0, end: 0 },
  };
}
