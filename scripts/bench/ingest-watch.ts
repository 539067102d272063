/**
 * What the bench watches while an ingest runs, and how it judges the figures:
 *  - the server's memory: the whole process tree (the server, its worker threads, which share its
 *    RSS, and any child process such as projinfo), sampled every 50 ms from /proc, beside the
 *    kernel's own high-water mark (VmHWM) of the server process;
 *  - /api/health every 25 ms (aim: p99 < 200 ms while the ingest runs);
 *  - the plain loads of the same file (scripts/bench/reference-loads.ts, BENCH_REF_RESULTS) and the
 *    aims: upload-to-saved within 4x of ogr2ogr's plain load up to 20,000 parcels, 5x above; peak
 *    server memory under 400 MB.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { BASE, pct } from './server';

export const MEMORY_AIM_MB = 400;
export const ratioAim = (count: number) => (count <= 20_000 ? 4 : 5);

function rssMb(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : 0;
  } catch {
    return 0;
  }
}

function children(pid: number): number[] {
  const out: number[] = [];
  try {
    for (const task of readdirSync(`/proc/${pid}/task`)) {
      const file = `/proc/${pid}/task/${task}/children`;
      if (existsSync(file)) out.push(...readFileSync(file, 'utf8').split(/\s+/).filter(Boolean).map(Number));
    }
  } catch {
    // the process ended while we looked
  }
  return out;
}

/** RSS of a process and all its descendants, in MB (threads share their process's RSS). */
export function treeRssMb(pid: number): number {
  return rssMb(pid) + children(pid).reduce((sum, c) => sum + treeRssMb(c), 0);
}

/**
 * Starts sampling the tree's memory and polling /api/health; `stop()` gives the peak and the answer times.
 * `phase(name)` ends a phase: `stop()` also gives the sampled peak of each phase, by name.
 */
export function watchIngest(pid: number) {
  let peakMb = treeRssMb(pid);
  let phasePeakMb = peakMb;
  const phases: { name: string; peakMb: number }[] = [];
  const phase = (name: string) => {
    phasePeakMb = Math.max(phasePeakMb, treeRssMb(pid));
    phases.push({ name, peakMb: phasePeakMb });
    phasePeakMb = 0;
  };
  const times: number[] = [];
  let failed = 0;
  let running = true;
  const sampler = setInterval(() => {
    const mb = treeRssMb(pid);
    peakMb = Math.max(peakMb, mb);
    phasePeakMb = Math.max(phasePeakMb, mb);
  }, 50);
  const poll = (async () => {
    while (running) {
      const t0 = performance.now();
      const ok = await fetch(`${BASE}/api/health`).then(
        (r) => r.text().then(() => r.ok),
        () => false,
      );
      if (ok) times.push(performance.now() - t0);
      else failed++;
      await new Promise((r) => setTimeout(r, 25));
    }
  })();
  const stop = async () => {
    running = false;
    clearInterval(sampler);
    await poll;
    return { peakMb, times, failed, phases };
  };
  return Object.assign(stop, { phase });
}

export function healthLine(times: number[], failed: number): string {
  if (times.length === 0) return `/api/health: no answer (${failed} failed)`;
  const p99 = pct(times, 99);
  return (
    `/api/health during the ingest: ${times.length} answers, ${failed} failed, ` +
    `p50 ${pct(times, 50).toFixed(1)} ms, p99 ${p99.toFixed(1)} ms, max ${Math.max(...times).toFixed(1)} ms (aim: ` +
    `p99 < 200 ms: ${p99 < 200 && failed === 0 ? 'PASS' : 'over'})`
  );
}

/** ogr2ogr's plain load of the same file (min and median seconds), when scripts/bench/reference-loads.ts ran. */
export function plainLoad(count: number, tool = 'ogr2ogr'): { min: number; median: number } | null {
  const file = process.env.BENCH_REF_RESULTS;
  if (!file || !existsSync(file)) return null;
  const line = readFileSync(file, 'utf8')
    .split('\n')
    .map((l) => l.split(' '))
    .find((f) => Number(f[0]) === count && f[1] === tool);
  return line ? { min: Number(line[2]), median: Number(line[3]) } : null;
}

export function ratioLine(count: number, seconds: number): string {
  const ref = plainLoad(count);
  if (!ref) return '(no plain load to compare with)';
  const ratio = seconds / ref.median;
  return (
    `${ratio.toFixed(1)}x ogr2ogr's median plain load ${ref.median.toFixed(2)} s (aim: ` +
    `within ${ratioAim(count)}x: ${ratio <= ratioAim(count) ? 'PASS' : 'over'})`
  );
}

export const memoryMark = (mb: number) => `(aim: < ${MEMORY_AIM_MB} MB: ${mb < MEMORY_AIM_MB ? 'PASS' : 'over'})`;
