// Bundles the three entry points (editor client, language server, CLI) into dist/.
// Type-checking is separate (`tsc -b`); esbuild only strips types.
import * as esbuild from 'esbuild';
import { readFileSync } from 'node:fs';

const { version } = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8'));

const production = process.argv.includes('--production');
const watch = process.argv.includes('--watch');

const common = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  sourcemap: !production,
  minify: production,
  logLevel: 'warning',
  external: ['vscode'],
  define: { LOOPWISE_VERSION: JSON.stringify(version) },
};

const entries = [
  { entryPoints: ['client/src/extension.ts'], outfile: 'dist/client.js' },
  { entryPoints: ['server/src/lsp/node/main.ts'], outfile: 'dist/server.js' },
  { entryPoints: ['server/src/lsp/node/analysisWorker.ts'], outfile: 'dist/analysisWorker.js' },
  { entryPoints: ['server/src/cli/main.ts'], outfile: 'dist/cli.js' },
];

const contexts = await Promise.all(entries.map((e) => esbuild.context({ ...common, ...e })));
if (watch) {
  await Promise.all(contexts.map((c) => c.watch()));
} else {
  await Promise.all(contexts.map((c) => c.rebuild()));
  await Promise.all(contexts.map((c) => c.dispose()));
}
