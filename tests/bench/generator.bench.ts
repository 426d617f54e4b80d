/**
 * Demo-data generator: time, CPU, peak memory and output size for assemblages of 100 and
 * 1,000 fragments (issue 4: 1,000 fragments under 5 minutes on this machine, bounded memory).
 * Each size runs in a child process so its peak resident memory is its own. Wall time depends
 * on what else the machine runs; CPU seconds (all threads) much less: on a quiet machine the
 * wall time is about cpu_s / workers.
 *
 *   npm run bench -- generator            (sizes 100 and 1000, default spacing, one worker per core)
 *   GENERATOR_BENCH_SIZES=1000 GENERATOR_BENCH_WORKERS=2 GENERATOR_BENCH_SPACING=1 npm run bench -- generator
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';

const here = import.meta.dirname;
const sizes = (process.env.GENERATOR_BENCH_SIZES ?? '100,1000').split(',').map(Number);
const spacing = process.env.GENERATOR_BENCH_SPACING;
const workers = process.env.GENERATOR_BENCH_WORKERS;

export default async function bench(): Promise<void> {
  const header = ['fragments', 'bones', 'joins', 'spacing_mm', 'workers', 'wall_s', 'cpu_s', 'cpu_s_per_fragment', 'fragments_per_s', 'peak_rss_mb', 'output_mb', 'load_before', 'load_after'];
  const rows: string[] = [];
  for (const n of sizes) {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-bench-gen-'));
    const loadBefore = loadavg()[0];
    try {
      const child = spawnSync(
        process.execPath,
        ['--import', 'tsx', join(here, 'generator-run.ts'), dir, String(n), spacing ?? '', workers ?? ''],
        { encoding: 'utf8', maxBuffer: 1 << 24 },
      );
      if (child.status !== 0) {
        rows.push(`${n}\tfailed: ${child.stderr.trim().split('\n').pop()}`);
        continue;
      }
      const r = JSON.parse(child.stdout) as { fragments: number; bones: number; joins: number; bytesWritten: number; seconds: number; peakRssMb: number; spacing: number; cpuSeconds: number; workers: number };
      rows.push(
        [
          n, r.bones, r.joins, r.spacing, r.workers, r.seconds.toFixed(1), r.cpuSeconds.toFixed(1), (r.cpuSeconds / r.fragments).toFixed(3),
          (r.fragments / r.seconds).toFixed(2), r.peakRssMb.toFixed(0), (r.bytesWritten / 1e6).toFixed(1), loadBefore.toFixed(1), loadavg()[0].toFixed(1),
        ].join('\t'),
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  process.stdout.write(`cores: ${availableParallelism()} (load = 1-minute load average)\n` + header.join('\t') + '\n' + rows.join('\n') + '\n');
}
