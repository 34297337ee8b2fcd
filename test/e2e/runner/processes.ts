/**
 * Checks that nothing the run started is left running: the process groups of the runner's direct
 * children (code-server runs in its own group, Playwright starts Chromium in its own) are read from
 * /proc (Linux) when they start, and after the browser and code-server were stopped, any process
 * still alive in them (zombies awaiting their reaper do not count) is waited for and then killed.
 */
import { readdirSync, readFileSync } from 'node:fs';

interface ProcessInfo {
  readonly pid: number;
  readonly ppid: number;
  readonly pgid: number;
  readonly state: string;
  readonly name: string;
}

function readProcesses(): ProcessInfo[] {
  let entries: string[];
  try {
    entries = readdirSync('/proc');
  } catch {
    return [];
  }
  const out: ProcessInfo[] = [];
  for (const entry of entries) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      // pid (comm) state ppid pgrp …; comm may contain spaces and parentheses, so split after the last ')'.
      const close = stat.lastIndexOf(')');
      const [state, ppid, pgid] = stat.slice(close + 2).split(' ');
      out.push({ pid: Number(entry), ppid: Number(ppid), pgid: Number(pgid), state: state ?? '?', name: stat.slice(stat.indexOf('(') + 1, close) });
    } catch {
      // Gone meanwhile.
    }
  }
  return out;
}

/** The process groups of this process's children other than its own group. */
export function getChildGroups(): Set<number> {
  const own = readProcesses().find((p) => p.pid === process.pid)?.pgid;
  return new Set(readProcesses().filter((p) => p.ppid === process.pid && p.pgid !== own).map((p) => p.pgid));
}

function getAlive(groups: ReadonlySet<number>): ProcessInfo[] {
  return readProcesses().filter((p) => groups.has(p.pgid) && p.state !== 'Z' && p.pid !== process.pid);
}

/**
 * Waits (polling /proc, up to `timeoutMs`) until no live process is left in `groups`; kills what is
 * left after that. Returns a description of what had to be killed, empty when nothing was left.
 */
export async function ensureGroupsEnded(groups: ReadonlySet<number>, timeoutMs: number): Promise<string[]> {
  const deadline = Date.now() + timeoutMs;
  let alive = getAlive(groups);
  while (alive.length > 0 && Date.now() < deadline) {
    await new Promise((resolve) => setTimeout(resolve, 50));
    alive = getAlive(groups);
  }
  for (const group of new Set(alive.map((p) => p.pgid))) {
    try {
      process.kill(-group, 'SIGKILL');
    } catch {
      // Ended meanwhile.
    }
  }
  return alive.map((p) => `${p.pid} ${p.name}`);
}
