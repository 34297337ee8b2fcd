/**
 * Case tables for checks (valid inputs, invalid inputs with exact spans, message ids, data, the fixed
 * text). Snippets are wrapped in an SVG whose user unit is exactly 1 mm, so figures read directly.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/engine/index';
import type { CheckDefinition } from '../../server/src/engine/checks/index';
import type { AnalysisOptions } from '../../server/src/engine/types';
import { applyEdits } from './applyEdits';

export const wrapSvg = (body: string): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">\n${body}\n</svg>\n`;

export interface ExpectedFinding {
  readonly messageId: string;
  /** The exact text the finding's span covers. */
  readonly at: string;
  /** Expected data values; numbers compare to 1e-9 relative. */
  readonly data?: Readonly<Record<string, string | number | boolean>>;
}

export interface CheckCase {
  readonly name: string;
  readonly svg: string;
  readonly options?: Partial<AnalysisOptions>;
}

export interface InvalidCase extends CheckCase {
  readonly findings: readonly ExpectedFinding[];
  /** The snippet after applying the first finding's first fix. */
  readonly fixed?: string;
}

export function checkCases(check: CheckDefinition, cases: { valid: readonly CheckCase[]; invalid: readonly InvalidCase[] }): void {
  const run = (c: CheckCase) => {
    const text = wrapSvg(c.svg);
    const result = analyze(text, 'svg', c.options);
    return { text, findings: result.findings.filter((f) => f.checkId === check.id) };
  };

  describe(check.id, () => {
    for (const c of cases.valid) {
      it(`accepts ${c.name}`, () => {
        expect(run(c).findings).toEqual([]);
      });
    }
    for (const c of cases.invalid) {
      it(`reports ${c.name}`, () => {
        const { text, findings } = run(c);
        expect(findings.map((f) => f.messageId)).toEqual(c.findings.map((f) => f.messageId));
        c.findings.forEach((expected, i) => {
          const f = findings[i]!;
          expect(text.slice(f.span.start, f.span.end)).toBe(expected.at);
          for (const [key, value] of Object.entries(expected.data ?? {})) {
            if (typeof value === 'number') {
              expect(f.data[key], key).toBeTypeOf('number');
              expect(Math.abs((f.data[key] as number) - value), key).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(value)));
            } else {
              expect(f.data[key], key).toBe(value);
            }
          }
          expect(f.message).not.toMatch(/\{\w+\}|NaN|undefined/);
        });
        if (c.fixed !== undefined) {
          const fix = findings[0]?.fixes?.[0];
          expect(fix, 'a quick fix').toBeDefined();
          const fixedText = applyEdits(text, fix!.edits);
          expect(fixedText).toBe(wrapSvg(c.fixed));
          const after = analyze(fixedText, 'svg', c.options).findings.filter((f) => f.checkId === check.id);
          expect(after).toEqual([]);
        }
      });
    }
  });
}
