import type { Decision } from '../../host/requests/joins';

/** One line for a decision on a join, then one line per derived value written or removed. */
export function printDecision(value: unknown, verb: string): void {
  const d = value as Decision & { removed?: boolean };
  const j = d.join;
  const what = d.removed ? 'removed' : verb;
  process.stdout.write(`join ${j.id} ${what}: ${j.a} + ${j.b}${j.type ? ` (${j.type})` : ''}\n`);
  for (const c of d.conflicts) process.stdout.write(`  forced over a conflict in ${c.field}: ${c.reason}\n`);
  for (const s of d.derived.set) process.stdout.write(`  ${s.specimen}: ${s.field} now derived as ${s.value}\n`);
  for (const s of d.derived.removed) process.stdout.write(`  ${s.specimen}: derived ${s.field} ${s.value} removed\n`);
}
