/**
 * The Loopwise language server: wiring between the LSP connection and the engine. Documents are
 * analysed on open and after edits (debounced), results are cached per (uri, version), and every
 * request handler is guarded so that no file and no engine bug can crash the server.
 */
import { CodeActionKind, MarkupKind, TextDocumentSyncKind, TextDocuments } from 'vscode-languageserver';
import type { CancellationToken, ClientCapabilities, Connection, InitializeResult } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { getFormatForPath } from '../engine/index';
import type { AnalysisFigures, FileFormat } from '../engine/index';
import type { Analyser } from './analyser';
import { getCodeActions } from './codeActions';
import { toDiagnostic } from './diagnostics';
import { getHover } from './hover';
import { ModelCache } from './modelCache';
import { ReanalyzeRequest } from './protocol';
import { formatError, runSafeAsync } from './runner';
import { SettingsStore } from './settings';
import { getDocumentSymbols } from './symbols';
import { ValidationQueue } from './validation';

/** The file format Loopwise reads for a document URI, from the extension of its path. */
export function getFormatForUri(uri: string): FileFormat | undefined {
  let path = uri;
  try {
    path = decodeURIComponent(new URL(uri).pathname);
  } catch {
    // Not a parseable URI (or bad percent-encoding): the raw string still ends with the extension.
  }
  return getFormatForPath(path);
}

interface ClientFeatures {
  configuration: boolean;
  relatedInformation: boolean;
  hoverKind: MarkupKind;
  codeActionLiterals: boolean;
  documentChanges: boolean;
}

function getClientFeatures(capabilities: ClientCapabilities): ClientFeatures {
  const hoverFormats = capabilities.textDocument?.hover?.contentFormat;
  return {
    configuration: capabilities.workspace?.configuration === true,
    relatedInformation: capabilities.textDocument?.publishDiagnostics?.relatedInformation === true,
    hoverKind: !hoverFormats || hoverFormats.includes(MarkupKind.Markdown) ? MarkupKind.Markdown : MarkupKind.PlainText,
    codeActionLiterals: capabilities.textDocument?.codeAction?.codeActionLiteralSupport !== undefined,
    documentChanges: capabilities.workspace?.workspaceEdit?.documentChanges === true,
  };
}

/** Starts serving on `connection`; analyses run on `analyser` (worker threads in the shipped server). */
export function startServer(connection: Connection, analyser: Analyser): void {
  const documents = new TextDocuments(TextDocument);
  const cache = new ModelCache<AnalysisFigures>();
  /** Analyses under way by (uri, version, generation), so a hover during validation waits for the same run. */
  const running = new Map<string, Promise<AnalysisFigures | undefined>>();
  let features: ClientFeatures = getClientFeatures({});
  const settings = new SettingsStore(connection, () => features.configuration);
  /** Bumped whenever the settings change, so results computed with older settings are not cached. */
  let generation = 0;

  /**
   * The analysis of `document` as it is now, from the cache or computed. Undefined when Loopwise
   * does not read this kind of file, or when the document changed (or the request was cancelled)
   * before the analysis finished — a newer run will follow.
   */
  async function getAnalysis(document: TextDocument, token?: CancellationToken): Promise<AnalysisFigures | undefined> {
    const format = getFormatForUri(document.uri);
    if (!format) return undefined;
    const { uri, version } = document;
    const startGeneration = generation;
    const cached = cache.get(uri, version, startGeneration);
    if (cached) return cached;
    const key = `${startGeneration}:${version}:${uri}`;
    const pending = running.get(key);
    if (pending) return pending;
    // Cancelling one request does not stop a run that others (validation) may be waiting for.
    const isOutdated = () => documents.get(uri)?.version !== version || generation !== startGeneration;
    const run = (async () => {
      const options = await settings.get(uri);
      if (isOutdated()) return undefined;
      const result = await analyser.analyse(document.getText(), format, options, isOutdated);
      if (result) cache.set(uri, version, startGeneration, result);
      return result;
    })();
    running.set(key, run);
    try {
      const result = await run;
      return token?.isCancellationRequested ? undefined : result;
    } finally {
      running.delete(key);
    }
  }

  async function validate(uri: string): Promise<void> {
    try {
      const document = documents.get(uri);
      if (!document) return;
      const version = document.version;
      if (!getFormatForUri(uri)) {
        await connection.sendDiagnostics({ uri, version, diagnostics: [] });
        return;
      }
      const result = await getAnalysis(document);
      // Stale: the document changed or closed meanwhile; its own run publishes instead.
      if (!result || documents.get(uri) !== document || document.version !== version) return;
      const options = { relatedInformation: features.relatedInformation };
      const diagnostics = result.findings.map((f) => toDiagnostic(f, document, options));
      await connection.sendDiagnostics({ uri, version, diagnostics });
    } catch (error) {
      connection.console.error(formatError(`Loopwise: analysing ${uri} failed`, error));
    }
  }

  const queue = new ValidationQueue(validate);
  /** Documents just opened: analysed at once rather than after the edit delay. */
  const justOpened = new Set<string>();

  connection.onInitialize((params): InitializeResult => {
    features = getClientFeatures(params.capabilities);
    return {
      capabilities: {
        textDocumentSync: TextDocumentSyncKind.Incremental,
        hoverProvider: true,
        documentSymbolProvider: true,
        ...(features.codeActionLiterals
          ? { codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix] } }
          : {}),
      },
      serverInfo: { name: 'loopwise' },
    };
  });

  connection.onDidChangeConfiguration((change) => {
    generation++;
    cache.clear();
    settings.reset(change.settings);
    for (const document of documents.all()) queue.schedule(document.uri, 0);
  });

  documents.onDidOpen((e) => justOpened.add(e.document.uri));
  documents.onDidChangeContent((e) => {
    const uri = e.document.uri;
    queue.schedule(uri, justOpened.delete(uri) ? 0 : undefined);
  });
  documents.onDidClose((e) => {
    const uri = e.document.uri;
    justOpened.delete(uri);
    queue.cancel(uri);
    cache.delete(uri);
    settings.forget(uri);
    connection.sendDiagnostics({ uri, diagnostics: [] }).catch((error: unknown) => {
      connection.console.error(formatError(`Loopwise: clearing problems of ${uri} failed`, error));
    });
  });

  /**
   * A guarded request on one document's analysis: `fallback` when the document is not open, has no
   * analysis (not a file Loopwise reads, outdated, cancelled) or the answer fails.
   */
  function answerFromAnalysis<T>(
    uri: string,
    token: CancellationToken,
    fallback: T,
    what: string,
    answer: (result: AnalysisFigures, document: TextDocument) => T,
  ): Promise<T> {
    return runSafeAsync(
      connection.console,
      token,
      async () => {
        const document = documents.get(uri);
        const result = document && (await getAnalysis(document, token));
        return document && result ? answer(result, document) : fallback;
      },
      fallback,
      `${what} in ${uri}`,
    );
  }

  connection.onHover((params, token) =>
    answerFromAnalysis(params.textDocument.uri, token, null, 'hover', (result, document) =>
      getHover(result, document, document.offsetAt(params.position), features.hoverKind)),
  );

  connection.onDocumentSymbol((params, token) =>
    answerFromAnalysis(params.textDocument.uri, token, [], 'document symbols', (result, document) =>
      getDocumentSymbols(result.contours, document)),
  );

  connection.onCodeAction((params, token) =>
    !features.codeActionLiterals ? [] : answerFromAnalysis(params.textDocument.uri, token, [], 'code actions', (result, document) =>
      getCodeActions(result, document, params.context.diagnostics, { documentChanges: features.documentChanges })),
  );

  connection.onRequest(ReanalyzeRequest, (_params, token) =>
    runSafeAsync(
      connection.console,
      token,
      async () => {
        generation++;
        cache.clear();
        settings.reset();
        const open = documents.all().filter((d) => getFormatForUri(d.uri) !== undefined);
        for (const document of open) queue.schedule(document.uri, 0);
        await queue.whenIdle();
        let findings = 0;
        for (const document of open) {
          findings += cache.get(document.uri, document.version, generation)?.findings.length ?? 0;
        }
        return { documents: open.length, findings };
      },
      { documents: 0, findings: 0 },
      'reanalysing open files',
    ),
  );

  connection.onShutdown(() => analyser.dispose());

  documents.listen(connection);
  connection.listen();
}
