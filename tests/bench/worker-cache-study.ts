/**
 * How often the workers of a propose run assemble a fragment from the match cache because their
 * cache of prepared fragments (proposal-worker.ts WORKER_CACHE_SIZE) no longer holds it:
 * `npx tsx tests/bench/worker-cache-study.ts <catalogue after a propose run> [cache size] [lookahead]`.
 * Replays the aligning stage's queue without aligning anything: the catalogue's done pairs
 * (table proposal_pair) in the run's band order (pair-order.ts; fragments numbered by scan id,
 * which the run's own numbering need not match exactly), taken by the affinity pool's rule
 * (affinity-pool.ts: the first task within `lookahead` whose fragments the worker holds, else the
 * one it holds most of) by SIM_WORKERS workers (default 2) whose tasks last 0.5-1.5 units at
 * random, each worker's cache a least-recently-used list as the pool mirrors it. Prints the
 * assemblies per worker (each fragment at least once per worker).
 */
import Database from 'better-sqlite3';
import { bandOrder } from '../../core/jobs/pair-order';

const db = new Database(process.argv[2], { readonly: true });
const cacheSize = Number(process.argv[3] ?? 120);
const lookahead = Number(process.argv[4] ?? 256);
const workers = Number(process.env.SIM_WORKERS ?? 2);
const pairs = db.prepare('select scan_a a, scan_b b from proposal_pair').all() as Array<{ a: number; b: number }>;
const scans = [...new Set(pairs.flatMap((p) => [p.a, p.b]))].sort((x, y) => x - y);
const slot = new Map(scans.map((s, i) => [s, i]));
const tasks = bandOrder(pairs, (p) => [slot.get(p.a)!, slot.get(p.b)!], scans.length).map((p) => [String(p.a), String(p.b)]);
const caches = Array.from({ length: workers }, () => new Map<string, true>());
const queue = tasks.map((_, i) => i);
const assemblies = new Array<number>(workers).fill(0);
const free = new Array<number>(workers).fill(0);
let seed = 7;
const random = (): number => (seed = (seed * 16807) % 2147483647) / 2147483647;
while (queue.length) {
  const w = free.indexOf(Math.min(...free));
  const cache = caches[w];
  let best = -1, bestHits = -1;
  for (let q = 0; q < Math.min(queue.length, lookahead); q++) {
    let hits = 0;
    for (const k of tasks[queue[q]]) if (cache.has(k)) hits++;
    if (hits > bestHits) { best = q; bestHits = hits; if (hits === 2) break; }
  }
  for (const k of tasks[queue.splice(best, 1)[0]]) {
    if (!cache.has(k)) assemblies[w]++;
    cache.delete(k);
    cache.set(k, true);
    while (cache.size > cacheSize) cache.delete(cache.keys().next().value as string);
  }
  free[w] += 0.5 + random();
}
process.stdout.write(`${tasks.length} fragment pairs, ${scans.length} fragments, ${workers} workers, cache ${cacheSize}, lookahead ${lookahead}: assemblies per worker ${assemblies.join(' / ')} (${assemblies.reduce((s, x) => s + x, 0)} in all)\n`);
