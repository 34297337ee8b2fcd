/** Builds dist/ once before the suites that start the real server or CLI (lsp.test.ts, cli.test.ts). */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export default function setup(): void {
  const root = fileURLToPath(new URL('..', import.meta.url));
  execFileSync(process.execPath, ['esbuild.mjs'], { cwd: root, stdio: 'inherit' });
}
