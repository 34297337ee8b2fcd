/**
 * The `loopwise` command line: argv in, report out, exit code back. File access comes through a
 * small `CliIo` so tests can run it in-process; main.ts wires it to node:fs and process.
 */
import { parseArgs } from 'node:util';
import { analyze, checks, getFormatForPath } from '../engine/index';
import type { AnalysisOptions, AssumedUnit, SeveritySetting } from '../engine/index';
import { renderJson, renderText, type FileReport } from './report';

export interface CliIo {
  readonly stdout: (s: string) => void;
  readonly stderr: (s: string) => void;
  /** Lists the files under a folder, recursively, as paths joined to it. */
  readonly listFiles: (folder: string) => Promise<string[]>;
  readonly isFolder: (path: string) => Promise<boolean>;
  readonly readText: (path: string) => Promise<string>;
  readonly version: string;
}

export const EXIT_CLEAN = 0;
export const EXIT_PROBLEMS = 1;
export const EXIT_USAGE = 2;

const UNITS: readonly AssumedUnit[] = ['auto', 'mm', 'cm', 'in', 'pt', 'px'];
const SEVERITIES: readonly SeveritySetting[] = ['off', 'info', 'warning', 'error'];

export const USAGE = `Usage: loopwise check [options] <files or folders…>

Measures every contour of SVG and DXF files and reports problems for cutting.
Folders are searched recursively for .svg and .dxf files.

Options:
  --json                        print the machine-readable JSON report
  --near-closed-tolerance <mm>  largest gap reported as near-closed (default 0.1)
  --assume-unit <unit>          unit for files without a physical size:
                                auto (px for SVG, mm for DXF), mm, cm, in, pt, px
  --ignore-layer <name>         skip the entities of a DXF layer (engraving, notes, …);
                                repeatable, case-insensitive
  --severity <id>=<level>       change a problem's severity (off, info, warning, error);
                                repeatable. Ids: ${checks.map((c) => c.id).join(', ')}
  -h, --help                    show this help
  -v, --version                 show the version

Exit codes: 0 no errors, 1 problems of error severity, 2 usage or unreadable input.
`;

class UsageError extends Error {}

function parseOptions(values: {
  'near-closed-tolerance'?: string | undefined;
  'assume-unit'?: string | undefined;
  'ignore-layer'?: string[] | undefined;
  severity?: string[] | undefined;
}): Partial<AnalysisOptions> {
  const options: { -readonly [K in keyof AnalysisOptions]?: AnalysisOptions[K] } = {};
  const tol = values['near-closed-tolerance'];
  if (tol !== undefined) {
    const n = Number(tol);
    if (tol.trim() === '' || !Number.isFinite(n) || n < 0) {
      throw new UsageError(`--near-closed-tolerance needs a number of mm ≥ 0, got '${tol}'`);
    }
    options.nearClosedToleranceMm = n;
  }
  const unit = values['assume-unit'];
  if (unit !== undefined) {
    if (!UNITS.includes(unit as AssumedUnit)) throw new UsageError(`--assume-unit must be one of ${UNITS.join(', ')}, got '${unit}'`);
    options.assumedUnit = unit as AssumedUnit;
  }
  const layers = values['ignore-layer'] ?? [];
  for (const name of layers) {
    if (name.trim() === '') throw new UsageError('--ignore-layer needs a layer name');
  }
  options.ignoredLayers = layers;
  const severity: Record<string, SeveritySetting> = {};
  for (const item of values.severity ?? []) {
    const [id, level] = item.split('=');
    if (!id || !checks.some((c) => c.id === id)) throw new UsageError(`--severity: unknown problem id '${id ?? ''}'`);
    if (!SEVERITIES.includes(level as SeveritySetting)) {
      throw new UsageError(`--severity ${id}: level must be one of ${SEVERITIES.join(', ')}, got '${level ?? ''}'`);
    }
    severity[id] = level as SeveritySetting;
  }
  options.severity = severity;
  return options;
}

async function collectFiles(paths: readonly string[], io: CliIo, reports: FileReport[]): Promise<string[]> {
  const files: string[] = [];
  for (const path of paths) {
    let folder: boolean;
    try {
      folder = await io.isFolder(path);
    } catch (e) {
      reports.push({ path, error: e instanceof Error ? e.message : String(e) });
      continue;
    }
    if (folder) {
      const found = (await io.listFiles(path)).filter((f) => getFormatForPath(f) !== undefined).sort();
      files.push(...found);
    } else if (getFormatForPath(path) !== undefined) {
      files.push(path);
    } else {
      reports.push({ path, error: 'not a file Loopwise reads (.svg, .dxf)' });
    }
  }
  return files;
}

/** Runs the CLI; resolves to the exit code. Never throws for bad input or unreadable files. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: [...argv],
      allowPositionals: true,
      options: {
        json: { type: 'boolean' },
        'near-closed-tolerance': { type: 'string' },
        'assume-unit': { type: 'string' },
        'ignore-layer': { type: 'string', multiple: true },
        severity: { type: 'string', multiple: true },
        help: { type: 'boolean', short: 'h' },
        version: { type: 'boolean', short: 'v' },
      },
    });
  } catch (e) {
    io.stderr(`loopwise: ${e instanceof Error ? e.message : String(e)}\n\n${USAGE}`);
    return EXIT_USAGE;
  }
  const { values, positionals } = parsed;
  if (values.help) {
    io.stdout(USAGE);
    return EXIT_CLEAN;
  }
  if (values.version) {
    io.stdout(`${io.version}\n`);
    return EXIT_CLEAN;
  }
  const [command, ...paths] = positionals;
  if (command !== 'check' || paths.length === 0) {
    io.stderr(command && command !== 'check' ? `loopwise: unknown command '${command}'\n\n${USAGE}` : USAGE);
    return EXIT_USAGE;
  }
  let options: Partial<AnalysisOptions>;
  try {
    options = parseOptions(values);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    io.stderr(`loopwise: ${e.message}\n`);
    return EXIT_USAGE;
  }

  const reports: FileReport[] = [];
  const files = await collectFiles(paths, io, reports);
  for (const path of files) {
    const format = getFormatForPath(path)!;
    let text: string;
    try {
      text = await io.readText(path);
    } catch (e) {
      reports.push({ path, error: e instanceof Error ? e.message : String(e) });
      continue;
    }
    reports.push({ path, text, result: analyze(text, format, options) });
  }

  io.stdout(values.json ? renderJson(reports) : renderText(reports));
  if (reports.some((r) => 'error' in r)) return EXIT_USAGE;
  if (files.length === 0) {
    io.stderr('loopwise: no .svg or .dxf files found\n');
    return EXIT_USAGE;
  }
  const hasErrors = reports.some((r) => 'result' in r && r.result.findings.some((f) => f.severity === 'error'));
  return hasErrors ? EXIT_PROBLEMS : EXIT_CLEAN;
}
