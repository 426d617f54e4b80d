/**
 * The screen's point pair voting alone, for speed work that must keep its answers:
 * `npx tsx tests/bench/pair-voting-speed.ts <catalogue>.match-cache [OUT.json]` runs
 * pointPairVoting, as the screen calls it, on every candidate face pair that pair voting serves
 * (the smaller face at most pairVoteMaxFaceSamples samples) among KNITBONE_PROFILE_PAIRS fragment
 * pairs (evenly strided, as match-speed.ts chooses them), KNITBONE_ROUNDS times (default 5;
 * the first round files the faces, the later ones find them filed), and prints the first round's
 * CPU seconds and the least of the others; OUT.json gets every hypothesis (transforms to the last
 * bit, votes) so that two versions compare with `cmp`. KNITBONE_COMPARE_MODULE=<path of another
 * point-pair-voting.ts> (say, main's in a detached worktree): each round runs both, one after the
 * other (which goes first alternating), prints both, and counts the face pairs whose hypotheses
 * differ in any bit.
 */
import { writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS } from '../../core/geometry/proposals/pairwise-match';
import { matchCachePairs } from './match-cache-pairs';
import { pointPairVoting, type PairVoteHypothesis } from '../../core/geometry/registration/point-pair-voting';

type Vote = typeof pointPairVoting;
const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? 300);
const rounds = Math.max(2, Number(process.env.KNITBONE_ROUNDS ?? 5));
const params = DEFAULT_MATCH_PARAMETERS;
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };

async function main(): Promise<void> {
  const other = process.env.KNITBONE_COMPARE_MODULE ? ((await import(process.env.KNITBONE_COMPARE_MODULE)) as { pointPairVoting: Vote }).pointPairVoting : undefined;
  const { grouped, assemble: get } = matchCachePairs(dir, maxPairs);
  const jobs: Array<(vote: Vote) => PairVoteHypothesis[]> = [];
  for (const list of grouped) {
    const a = get(list[0].a), b = get(list[0].b);
    const spacing = Math.max(a.spacing, b.spacing);
    for (const c of list) {
      const FA = a.faces[c.faceA], FB = b.faces[c.faceB];
      if (Math.min(FA.points.length, FB.points.length) / 3 > params.pairVoteMaxFaceSamples) continue;
      jobs.push((vote) => vote(FA.points, FA.normals, FB.points, FB.normals, { spacing, maxSamples: params.pairVoteSamples, references: params.pairVoteReferences, hypotheses: params.pairVoteHypotheses }));
    }
  }
  const versions: Array<[string, Vote]> = other ? [['this', pointPairVoting], ['compared', other]] : [['this', pointPairVoting]];
  const first = new Map<string, number>(), least = new Map<string, number>();
  const results = new Map<string, PairVoteHypothesis[][]>();
  for (let r = 0; r < rounds; r++) {
    const order = r % 2 ? [...versions].reverse() : versions;
    for (const [name, vote] of order) {
      const t = cpu();
      const res = jobs.map((f) => f(vote));
      const used = cpu() - t;
      if (r === 0) first.set(name, used);
      else least.set(name, Math.min(least.get(name) ?? Infinity, used));
      results.set(name, res);
    }
  }
  const text = (name: string): string => `${name}: first round ${first.get(name)!.toFixed(3)}, least of the others ${least.get(name)!.toFixed(3)}`;
  let differ = 0;
  if (other) {
    const x = results.get('this')!, y = results.get('compared')!;
    x.forEach((h, k) => { if (JSON.stringify(h) !== JSON.stringify(y[k])) differ++; });
  }
  process.stdout.write(`${jobs.length} small face pairs, ${rounds} rounds, CPU s: ${versions.map(([n]) => text(n)).join('; ')}${other ? `; face pairs whose hypotheses differ ${differ}` : ''}; load ${loadavg()[0].toFixed(1)}\n`);
  if (out) writeFileSync(out, JSON.stringify(results.get('this')));
}

void main();
