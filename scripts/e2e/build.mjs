// Builds what the editor tests run: the extension itself (`npm run build` → dist/), the in-host
// suite (out/e2e/suite.js, CommonJS, loaded by VS Code's extension host through `extensionTestsPath`)
// and the runner that drives code-server and Chromium (out/e2e/runner.mjs).
// Type-checking is separate (`tsc -b test/e2e`); esbuild only strips types.
import { spawnSync } from 'node:child_process';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as esbuild from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

const build = spawnSync(process.execPath, [path.join(root, 'esbuild.mjs')], { cwd: root, stdio: 'inherit' });
if (build.status !== 0) {
  console.error(`e2e build: building the extension failed (exit ${build.status ?? build.signal})`);
  process.exit(1);
}

const common = { bundle: true, platform: 'node', target: 'node20', sourcemap: 'inline', logLevel: 'warning', absWorkingDir: root };
await Promise.all([
  esbuild.build({
    ...common,
    entryPoints: ['test/e2e/suite/index.ts'],
    outfile: 'out/e2e/suite.js',
    format: 'cjs',
    external: ['vscode'],
  }),
  esbuild.build({
    ...common,
    entryPoints: ['test/e2e/runner/main.ts'],
    outfile: 'out/e2e/runner.mjs',
    format: 'esm',
    packages: 'external',
  }),
]);
