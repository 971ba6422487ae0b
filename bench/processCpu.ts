import { readdirSync, readFileSync } from 'node:fs';
import os from 'node:os';

/**
 * CPU time of processes, read from Linux's /proc (utime + stime, in clock
 * ticks of 1/100 s). bench:web reports it beside wall-clock times: on a busy
 * machine wall time measures the neighbours as much as the page, while CPU
 * per request measures the page. Elsewhere than Linux it reports nothing.
 */
const TICKS_PER_S = 100;

function ticks(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return Number(fields[11]) + Number(fields[12]); // utime, stime (fields 14 and 15)
  } catch {
    return 0;
  }
}

/** `pid` and every process below it. */
export function processTree(pid: number): number[] {
  const children = new Map<number, number[]>();
  let entries: string[] = [];
  try {
    entries = readdirSync('/proc').filter((e) => /^\d+$/.test(e));
  } catch {
    return [pid];
  }
  for (const e of entries) {
    try {
      const stat = readFileSync(`/proc/${e}/stat`, 'utf8');
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      children.set(ppid, [...(children.get(ppid) ?? []), Number(e)]);
    } catch {
      // Gone meanwhile.
    }
  }
  const out: number[] = [];
  const visit = (p: number) => {
    out.push(p);
    for (const c of children.get(p) ?? []) visit(c);
  };
  visit(pid);
  return out;
}

/** Seconds of CPU used so far by these processes; null when /proc is not there. */
export function cpuSeconds(pids: readonly number[]): number | null {
  if (os.platform() !== 'linux') return null;
  return pids.reduce((s, p) => s + ticks(p), 0) / TICKS_PER_S;
}
