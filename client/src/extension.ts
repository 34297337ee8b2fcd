/**
 * The VS Code side of Loopwise: starts the language server (dist/server.js) over IPC and registers
 * the commands. Everything else happens in the server.
 */
import type { ExtensionContext } from 'vscode';
import { LanguageClient, TransportKind } from 'vscode-languageclient/node';
import type { LanguageClientOptions, ServerOptions } from 'vscode-languageclient/node';
import { registerCommands } from './commands';

let client: LanguageClient | undefined;

export async function activate(context: ExtensionContext): Promise<void> {
  const module = context.asAbsolutePath('dist/server.js');
  const serverOptions: ServerOptions = {
    run: { module, transport: TransportKind.ipc },
    debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6019'] } },
  };
  const clientOptions: LanguageClientOptions = {
    // VS Code gives .svg files the `xml` language id, so SVG is selected by file pattern.
    documentSelector: [
      { scheme: 'file', pattern: '**/*.svg' },
      { scheme: 'file', language: 'dxf' },
    ],
    synchronize: { configurationSection: 'loopwise' },
  };
  client = new LanguageClient('loopwise', 'Loopwise', serverOptions, clientOptions);
  registerCommands(context, client);
  await client.start();
}

export async function deactivate(): Promise<void> {
  if (!client) return;
  const running = client;
  client = undefined;
  await running.stop();
}
