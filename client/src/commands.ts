/** Editor commands; each sends one typed custom request to the server. */
import { commands, window } from 'vscode';
import type { ExtensionContext } from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import { ReanalyzeRequest } from '../../server/src/lsp/protocol';

export function registerCommands(context: ExtensionContext, client: LanguageClient): void {
  context.subscriptions.push(
    commands.registerCommand('loopwise.reanalyze', async () => {
      try {
        const { documents, findings } = await client.sendRequest(ReanalyzeRequest, {});
        const files = documents === 1 ? '1 open file' : `${documents} open files`;
        const problems = findings === 1 ? '1 problem' : `${findings} problems`;
        window.setStatusBarMessage(`Loopwise: re-analysed ${files}, ${problems}.`, 5000);
      } catch (error) {
        void window.showErrorMessage(`Loopwise: re-analysing failed: ${error instanceof Error ? error.message : String(error)}`);
      }
    }),
  );
}
