import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Host } from '../../../core/host/host';
import { JOIN_TYPES } from '../../../core/refits/join-type';
import { catalogueWith, readBack } from './helpers';

// Property of issue 3, through the host and a real catalogue: accepting a join then undoing
// it returns every count and derived value to what it was; refitted NISP never exceeds
// recorded NISP plus the specimens newly identified through joins.
const host = new Host();
const TAXA = [null, 'Mammalia', 'Artiodactyla', 'Cervidae', 'Cervus elaphus', 'Bovidae', 'Bos taurus'];
const ELEMENTS = [null, 'bone', 'long bone', 'upper limb long bone', 'femur', 'humerus', 'tibia', 'atlas'];
const SIDES = [null, 'left', 'right', 'indeterminate'] as const;
const ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'];

const specimen = (i: number) =>
  fc.record({
    taxon: fc.constantFrom(...TAXA),
    element: fc.constantFrom(...ELEMENTS),
    side: fc.constantFrom(...SIDES),
    portion: fc.subarray(ZONES, { maxLength: 2 }),
    sizeClass: fc.constantFrom(null, 2, 3, 4),
  }).map((s) => ({ catalogueNo: `P-${i}`, ...s, portion: s.element && ['femur', 'humerus', 'tibia', 'long bone', 'upper limb long bone'].includes(s.element) ? s.portion : [] }));

const scenario = fc.integer({ min: 3, max: 7 }).chain((n) =>
  fc.tuple(
    fc.tuple(...Array.from({ length: n }, (_, i) => specimen(i))),
    fc.array(fc.record({ a: fc.nat(n - 1), b: fc.nat(n - 1), type: fc.constantFrom(...JOIN_TYPES), keep: fc.boolean() }), { minLength: 1, maxLength: 6 }),
  ),
);

describe('accept then undo through the host (property)', () => {
  it('restores counts and derived values; refitted NISP is bounded', async () => {
    await fc.assert(
      fc.asyncProperty(scenario, async ([specimens, steps]) => {
        const c = catalogueWith(specimens);
        try {
          for (const step of steps) {
            if (step.a === step.b) continue;
            const a = specimens[step.a].catalogueNo;
            const b = specimens[step.b].catalogueNo;
            const counts = await host.call('tally.counts', { catalogue: c.path });
            const derived = readBack(c.path).derived;
            const linked = await host
              .call('joins.link', { catalogue: c.path, a, b, type: step.type, force: true })
              .catch((e: { kind?: string }) => (e.kind === 'conflict' ? null : Promise.reject(e))); // already joined
            if (!linked) continue;
            const after = await host.call('tally.counts', { catalogue: c.path });
            expect(after.recorded).toEqual(counts.recorded);
            const newly = new Set(readBack(c.path).derived.map((d) => d.specimenId)).size;
            expect(after.refitted.nisp).toBeLessThanOrEqual(after.recorded.nisp + newly);
            if (!step.keep) {
              await host.call('joins.unlink', { catalogue: c.path, id: linked.join.id });
              expect(await host.call('tally.counts', { catalogue: c.path })).toEqual(counts);
              expect(readBack(c.path).derived).toEqual(derived);
            }
          }
        } finally {
          c.cleanup();
        }
      }),
      { numRuns: 12 },
    );
  });
});
