/** One generator run for generator.bench.ts: prints its summary, CPU time and peak memory as JSON. */
import { DEFAULT_POINT_SPACING, generateAssemblage } from '../../demo-data/generate';

const [dir, n, spacingArg, workersArg] = process.argv.slice(2);
const spacing = spacingArg ? Number(spacingArg) : DEFAULT_POINT_SPACING;
let peak = 0;
const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 50);
const summary = await generateAssemblage(
  { outDir: dir, fragments: Number(n), seed: `bench-${n}`, pointSpacing: spacing, workers: workersArg ? Number(workersArg) : undefined },
  () => {
    peak = Math.max(peak, process.memoryUsage().rss);
  },
);
clearInterval(timer);
peak = Math.max(peak, process.memoryUsage().rss);
// the whole process: the main thread and every worker thread
const cpu = process.cpuUsage();
process.stdout.write(JSON.stringify({ ...summary, spacing, peakRssMb: peak / 1e6, cpuSeconds: (cpu.user + cpu.system) / 1e6 }) + '\n');
