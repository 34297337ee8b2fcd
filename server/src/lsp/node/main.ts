/**
 * Node entry of the language server (bundled to dist/server.js). The transport comes from argv:
 * `--node-ipc` when VS Code starts it, `--stdio` (or `--socket=<port>`) for other clients and tests.
 */
import { ProposedFeatures, createConnection } from 'vscode-languageserver/node';
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

startServer(connection);
