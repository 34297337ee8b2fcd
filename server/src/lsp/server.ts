/**
 * The Loopwise language server: wiring between the LSP connection and the engine. Documents are
 * analysed on open and after edits (debounced), results are cached per (uri, version), and every
 * request handler is guarded so that no file and no engine bug can crash the server. Each analysis
 * answers twice: its findings first (published as diagnostics, enough for code actions and symbols),
 * then the contours' roundness and hull, which only the hover cards wait for.
 */
import { CodeActionKind, MarkupKind, TextDocumentSyncKind, TextDocuments } from 'vscode-languageserver';
import type { CancellationToken, ClientCapabilities, Connection, InitializeResult } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { getFormatForPath } from '../engine/index';
import type { AnalysisFigures, FileFormat, OutlineFigures } from '../engine/index';
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

/** One analysis of one document version: its findings' figures come first, the whole result later. */
interface Run {
  readonly outlines: Promise<OutlineFigures | undefined>;
  readonly complete: Promise<AnalysisFigures | undefined>;
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
  /** Whole analyses, and the findings' figures of analyses whose shapes are still being measured. */
  const cache = new ModelCache<AnalysisFigures>();
  const outlineCache = new ModelCache<OutlineFigures>();
  /** Analyses under way by (uri, version, generation), so a hover during validation waits for the same run. */
  const running = new Map<string, Run>();
  let features: ClientFeatures = getClientFeatures({});
  const settings = new SettingsStore(connection, () => features.configuration);
  /** Bumped whenever the settings change, so results computed with older settings are not cached. */
  let generation = 0;

  /** The cached analysis of (uri, version) under this generation's settings: whole, or up to its findings. */
  function getCached(uri: string, version: number, stage: keyof Run): OutlineFigures | undefined {
    return cache.get(uri, version, generation) ?? (stage === 'outlines' ? outlineCache.get(uri, version, generation) : undefined);
  }

  /** The run analysing `document` as it is now: the one under way, or a new one. */
  function getRun(document: TextDocument, format: FileFormat): Run {
    const { uri, version } = document;
    const startGeneration = generation;
    const key = `${startGeneration}:${version}:${uri}`;
    const pending = running.get(key);
    if (pending) return pending;
    const isOutdated = () => documents.get(uri)?.version !== version || generation !== startGeneration;
    let settleOutlines: (figures: OutlineFigures | undefined) => void = () => {};
    let failOutlines: (error: unknown) => void = () => {};
    const outlines = new Promise<OutlineFigures | undefined>((resolve, reject) => {
      settleOutlines = resolve;
      failOutlines = reject;
    });
    const complete = (async () => {
      const options = await settings.get(uri);
      if (isOutdated()) return undefined;
      const result = await analyser.analyse(document.getText(), format, options, isOutdated, (figures) => {
        outlineCache.set(uri, version, startGeneration, figures);
        settleOutlines(figures);
      });
      if (result) {
        cache.set(uri, version, startGeneration, result);
        // The whole result answers for its findings too: drop the first answer's copy of them.
        if (outlineCache.get(uri, version, startGeneration)) outlineCache.delete(uri);
      }
      return result;
    })();
    // A run that ends without its findings (cancelled, failed) settles them too; a promise settles
    // once, so this changes nothing for a run that delivered them. No waiter is required of either.
    const forget = () => running.delete(key);
    complete.then((result) => settleOutlines(result), (error: unknown) => failOutlines(error)).then(forget, forget);
    outlines.catch(() => {});
    const run: Run = { outlines, complete };
    running.set(key, run);
    return run;
  }

  /**
   * The analysis of `document` as it is now (`complete`: with every contour's roundness and hull;
   * `outlines`: up to its findings), from the cache or computed. Undefined when Loopwise does not
   * read this kind of file, or when the document changed (or the request was cancelled) before the
   * analysis finished — a newer run will follow.
   */
  async function getAnalysis(document: TextDocument, stage: 'complete', token?: CancellationToken): Promise<AnalysisFigures | undefined>;
  async function getAnalysis(document: TextDocument, stage: 'outlines', token?: CancellationToken): Promise<OutlineFigures | undefined>;
  async function getAnalysis(document: TextDocument, stage: keyof Run, token?: CancellationToken): Promise<OutlineFigures | undefined> {
    const format = getFormatForUri(document.uri);
    if (!format) return undefined;
    const { uri, version } = document;
    const cached = getCached(uri, version, stage);
    if (cached) return cached;
    // Cancelling one request does not stop a run that others (validation) may be waiting for.
    const result = await getRun(document, format)[stage];
    return token?.isCancellationRequested ? undefined : result;
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
      const result = await getAnalysis(document, 'outlines');
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
    outlineCache.clear();
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
    outlineCache.delete(uri);
    settings.forget(uri);
    connection.sendDiagnostics({ uri, diagnostics: [] }).catch((error: unknown) => {
      connection.console.error(formatError(`Loopwise: clearing problems of ${uri} failed`, error));
    });
  });

  /**
   * A guarded request on one document's analysis: `fallback` when the document is not open, has no
   * analysis (not a file Loopwise reads, outdated, cancelled) or the answer fails.
   */
  function answerFromAnalysis<T, R>(
    uri: string,
    token: CancellationToken,
    fallback: T,
    what: string,
    load: (document: TextDocument) => Promise<R | undefined>,
    answer: (result: R, document: TextDocument) => T,
  ): Promise<T> {
    return runSafeAsync(
      connection.console,
      token,
      async () => {
        const document = documents.get(uri);
        const result = document && (await load(document));
        return document && result ? answer(result, document) : fallback;
      },
      fallback,
      `${what} in ${uri}`,
    );
  }

  connection.onHover((params, token) =>
    answerFromAnalysis(params.textDocument.uri, token, null, 'hover', (d) => getAnalysis(d, 'complete', token), (result, document) =>
      getHover(result, document, document.offsetAt(params.position), features.hoverKind)),
  );

  connection.onDocumentSymbol((params, token) =>
    answerFromAnalysis(params.textDocument.uri, token, [], 'document symbols', (d) => getAnalysis(d, 'outlines', token), (result, document) =>
      getDocumentSymbols(result.contours, document)),
  );

  connection.onCodeAction((params, token) =>
    !features.codeActionLiterals ? [] : answerFromAnalysis(params.textDocument.uri, token, [], 'code actions', (d) => getAnalysis(d, 'outlines', token), (result, document) =>
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
          const result = getCached(document.uri, document.version, 'outlines');
          findings += result?.findings.length ?? 0;
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
