/**
 * Demo-data generator: time, peak memory and output size for assemblages of 100 and 1,000
 * fragments (issue 4: 1,000 fragments under 5 minutes on this machine, bounded memory).
 * Each size runs in a child process so its peak resident memory is its own. Wall time depends
 * on what else the machine runs; CPU seconds less so.
 *
 *   npm run bench -- generator            (sizes 100 and 1000, default point spacing)
 *   GENERATOR_BENCH_SIZES=100 GENERATOR_BENCH_SPACING=1 npm run bench -- generator
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const here = import.meta.dirname;
const sizes = (process.env.GENERATOR_BENCH_SIZES ?? '100,1000').split(',').map(Number);
const spacing = process.env.GENERATOR_BENCH_SPACING;

export default async function bench(): Promise<void> {
  const rows: string[] = [];
  for (const n of sizes) {
    const dir = mkdtempSync(join(tmpdir(), 'knitbone-bench-gen-'));
    try {
      const child = spawnSync(
        process.execPath,
        ['--import', 'tsx', join(here, 'generator-run.ts'), dir, String(n), spacing ?? ''],
        { encoding: 'utf8', maxBuffer: 1 << 24 },
      );
      if (child.status !== 0) {
        rows.push(`${n}\tfailed: ${child.stderr.trim().split('\n').pop()}`);
        continue;
      }
      const r = JSON.parse(child.stdout) as { fragments: number; bones: number; joins: number; bytesWritten: number; seconds: number; peakRssMb: number; spacing: number; cpuSeconds?: number };
      rows.push(
        [n, r.bones, r.joins, r.spacing, r.seconds.toFixed(1), r.cpuSeconds?.toFixed(1) ?? '', (r.seconds / r.fragments * 1000).toFixed(0), r.peakRssMb.toFixed(0), (r.bytesWritten / 1e6).toFixed(1)].join('\t'),
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  process.stdout.write('fragments\tbones\tjoins\tspacing_mm\twall_s\tcpu_s\tms_per_fragment_wall\tpeak_rss_mb\toutput_mb\n' + rows.join('\n') + '\n');
}
