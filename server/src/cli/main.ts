/** Node entry of the CLI: wires runCli to the file system and the process. */
import { readFile, readdir, stat } from 'node:fs/promises';
import { join, relative } from 'node:path';
import { runCli, type CliIo } from './run';

declare const LOOPWISE_VERSION: string | undefined;

/** Dependency folders and hidden folders (.git, …) below the given folder are not searched. */
function isSkipped(relativeFolder: string): boolean {
  return relativeFolder.split(/[\\/]/).some((part) => part === 'node_modules' || (part.startsWith('.') && part !== '.' && part !== '..'));
}

async function listFiles(folder: string): Promise<string[]> {
  const entries = await readdir(folder, { withFileTypes: true, recursive: true });
  return entries
    .filter((e) => e.isFile() && !isSkipped(relative(folder, e.parentPath)))
    .map((e) => join(e.parentPath, e.name));
}

const io: CliIo = {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  listFiles,
  isFolder: async (path) => (await stat(path)).isDirectory(),
  readText: async (path) => {
    const text = await readFile(path, 'utf8');
    // A byte-order mark is not part of the drawing; dropping it keeps columns as editors show them.
    return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  },
  version: typeof LOOPWISE_VERSION === 'string' ? LOOPWISE_VERSION : 'development',
};

runCli(process.argv.slice(2), io).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`loopwise: internal error: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    process.exitCode = 2;
  },
);
