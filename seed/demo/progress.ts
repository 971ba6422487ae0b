import type { BackfillProgress } from './backfill';

/** "1.2 GB", "340 MB", "12 kB". */
export function formatBytes(n: number): string {
  const units = ['B', 'kB', 'MB', 'GB', 'TB'];
  let i = 0;
  while (n >= 1000 && i < units.length - 1) {
    n /= 1000;
    i++;
  }
  return `${n >= 100 || i === 0 ? n.toFixed(0) : n.toFixed(1)} ${units[i]}`;
}

/** One line of backfill progress: percentage, vessel-days, data, time taken and left. */
export function progressLine(p: BackfillProgress, width = 24): string {
  const frac = p.totalVesselDays > 0 ? p.vesselDays / p.totalVesselDays : 1;
  const filled = Math.round(frac * width);
  const bar = '█'.repeat(filled) + '░'.repeat(width - filled);
  const s = p.elapsedMs / 1000;
  const left = frac > 0 && frac < 1 ? `, ${Math.ceil((s * (1 - frac)) / frac)} s left` : '';
  return `backfill ${bar} ${(100 * frac).toFixed(0).padStart(3)}%  ${p.vesselDays}/${p.totalVesselDays} vessel-days  ${p.messages} messages  ${formatBytes(p.bytes)}  ${s.toFixed(0)} s${left}`;
}

/**
 * A progress bar on a terminal (redrawn in place, at most every 100 ms), or
 * a line per 10 % when the stream is not a terminal (logs, CI).
 */
export function progressBar(stream: NodeJS.WriteStream = process.stderr): { update: (p: BackfillProgress) => void; done: (p: BackfillProgress) => void } {
  let lastDraw = 0;
  let lastStep = -1;
  return {
    update(p) {
      if (stream.isTTY) {
        const now = Date.now();
        if (now - lastDraw < 100) return;
        lastDraw = now;
        stream.write(`\r${progressLine(p)}\x1b[K`);
        return;
      }
      const step = Math.floor((10 * p.vesselDays) / Math.max(1, p.totalVesselDays));
      if (step > lastStep) {
        lastStep = step;
        stream.write(`${progressLine(p)}\n`);
      }
    },
    done(p) {
      stream.write(stream.isTTY ? `\r${progressLine(p)}\x1b[K\n` : `${progressLine(p)}\n`);
    },
  };
}
