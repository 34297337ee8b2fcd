/**
 * Guards for request handlers: a handler that throws or is cancelled answers a harmless default and
 * logs, so a bad file or an engine bug never takes the server down.
 */
import type { CancellationToken, RemoteConsole } from 'vscode-languageserver';

export function formatError(message: string, error: unknown): string {
  if (error instanceof Error) return `${message}: ${error.message}\n${error.stack ?? ''}`;
  return `${message}: ${String(error)}`;
}

export async function runSafeAsync<T>(
  console: RemoteConsole,
  token: CancellationToken,
  run: () => Promise<T>,
  fallback: T,
  what: string,
): Promise<T> {
  if (token.isCancellationRequested) return fallback;
  try {
    const value = await run();
    return token.isCancellationRequested ? fallback : value;
  } catch (error) {
    console.error(formatError(`Loopwise: ${what} failed`, error));
    return fallback;
  }
}
