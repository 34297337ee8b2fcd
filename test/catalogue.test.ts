/**
 * Every check is complete: documented in the README under its id with its default severity and
 * ✗/✓ examples, tested beside its module, and registered once.
 */
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checks } from '../server/src/engine/checks/index';

const root = fileURLToPath(new URL('..', import.meta.url));
const readme = readFileSync(`${root}README.md`, 'utf8');

/** The README section of a check: from its `### id` heading to the next heading. */
function section(id: string): string | undefined {
  const start = readme.indexOf(`\n### ${id}\n`);
  if (start < 0) return undefined;
  const next = readme.slice(start + 1).search(/\n#{2,3} /);
  return next < 0 ? readme.slice(start) : readme.slice(start, start + 1 + next);
}

const capitalised = (s: string) => s[0]!.toUpperCase() + s.slice(1);

describe('the check catalogue', () => {
  it('has unique kebab-case ids', () => {
    const ids = checks.map((c) => c.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of ids) expect(id).toMatch(/^[a-z]+(-[a-z]+)*$/);
  });

  for (const check of checks) {
    describe(check.id, () => {
      it('is documented in the README with its default severity, a ✗ and a ✓ example and when not to use it', () => {
        const text = section(check.id);
        expect(text, `README section "### ${check.id}"`).toBeDefined();
        const severity = check.defaultSeverity === 'info' ? 'Information' : capitalised(check.defaultSeverity);
        expect(text).toContain(`**${severity}.**`);
        expect(text).toContain('✗');
        expect(text).toContain('✓');
        expect(text).toContain('When not to use it');
      });

      it('has a test file beside its module', () => {
        expect(existsSync(`${root}server/src/engine/checks/${check.id}.test.ts`)).toBe(true);
      });

      it('has message templates that name only data it can fill', () => {
        for (const template of Object.values(check.messages)) {
          expect(template).toMatch(/\.$/);
          expect(template).not.toMatch(/\{\s|\s\}/);
        }
      });
    });
  }
});
