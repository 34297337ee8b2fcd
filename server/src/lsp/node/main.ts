/**
 * Node entry of the language server (bundled to dist/server.js). The transport comes from argv:
 * `--node-ipc` when VS Code starts it, `--stdio` (or `--socket=<port>`) for other clients and tests.
 */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { ProposedFeatures, createConnection } from 'vscode-languageserver/node';
import { WorkerAnalyser } from '../analyser';
import { formatError } from '../runner';
import { startServer } from '../server';

const connection = createConnection(ProposedFeatures.all);
// Requests are guarded one by one; this catches what escapes them (a rejected notification handler).
process.on('unhandledRejection', (error) => {
  connection.console.error(formatError('Loopwise: unhandled rejection', error));
});
process.on('uncaughtException', (error) => {
  connection.console.error(formatError('Loopwise: uncaught exception', error));
});

// Two workers at most: a huge file being analysed leaves one free for the file being edited.
const analyser = new WorkerAnalyser({
  workerPath: join(__dirname, 'analysisWorker.js'),
  workers: Math.min(2, availableParallelism()),
  maxHeapMb: 4096,
  cancelGraceMs: 500,
  onTerminated: () => connection.console.log('Loopwise: stopped an outdated analysis that ran on past its cancellation.'),
});
startServer(connection, analyser);
