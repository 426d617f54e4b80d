import { z } from 'zod';
import { withCatalogue } from '../../catalogue/catalogue';
import type { ElementTally } from '../../quant/tally';
import type { Conflict } from '../../refits/conflict';
import { JOIN_TYPES } from '../../refits/join-type';
import { countsOf, identificationRuleOf } from '../counting/counts-of';
import { decisionKind } from '../counting/join-kind';
import { refitsOf } from '../counting/refits-of';
import { KnitboneError } from '../errors';
import { defineRequest } from '../request';

type Field = 'taxon' | 'element' | 'side';
const FIELDS: Field[] = ['taxon', 'element', 'side'];

type ElementCounts = { nisp: number; mneLeft: number; mneRight: number; mne: number };

export interface JoinPreview {
  joinId: number;
  type: string;
  conflicts: Conflict[];
  /** Identifications that accepting would derive or change, per specimen and field. */
  derived: Array<{ specimen: string; field: Field; before: string | null; after: string | null }>;
  /** Element counts (refitted) that accepting would change. */
  elements: Array<{ taxon: string; element: string; before: ElementCounts | null; after: ElementCounts | null }>;
  nisp: { before: number; after: number };
  identifiedToElement: { before: number; after: number };
}

const pick = (e: ElementTally | undefined): ElementCounts | null =>
  e ? { nisp: e.nisp, mneLeft: e.mneLeft, mneRight: e.mneRight, mne: e.mne } : null;

/**
 * Requests of the join review screen: what accepting a proposal would change, computed on
 * an in-memory copy of the refit state. Nothing is written.
 */
export const reviewRequests = {
  'joins.preview': defineRequest({
    summary: 'What accepting a join would change (derived identifications, NISP, MNE), without writing anything',
    input: z
      .object({
        catalogue: z.string().trim().min(1, 'give the path of a catalogue file'),
        id: z.number().int().positive(),
        type: z.enum(JOIN_TYPES).optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat): JoinPreview => {
        const join = cat.joins.require(input.id);
        if (join.status === 'accepted') throw new KnitboneError('conflict', `join ${input.id} is already accepted`);
        const kind = decisionKind(join, input.type);
        const refits = refitsOf(cat);
        const rule = identificationRuleOf(cat);
        const a = refits.byId.get(join.specimenA)!.catalogueNo;
        const b = refits.byId.get(join.specimenB)!.catalogueNo;
        const rj = { id: join.id, a, b, type: kind };
        const before = countsOf(refits, rule);
        const conflicts = refits.state.check(rj);
        const members = new Set([...refits.state.linkedMembers(a), ...refits.state.linkedMembers(b)]);
        const derivedBefore = new Map([...members].map((s) => [s, refits.state.derivedFor(s)]));
        const same = { before: before.refitted.nisp, after: before.refitted.nisp };
        if (conflicts.length) {
          return {
            joinId: join.id, type: kind, conflicts, derived: [], elements: [], nisp: same,
            identifiedToElement: { before: before.refitted.identifiedToElement, after: before.refitted.identifiedToElement },
          };
        }
        refits.state.accept(rj);
        const after = countsOf(refits, rule);
        const derived: JoinPreview['derived'] = [];
        for (const s of refits.state.linkedMembers(a)) {
          const was = derivedBefore.get(s) ?? refits.state.derivedFor(s);
          const now = refits.state.derivedFor(s);
          for (const f of FIELDS) {
            const x = was[f]?.value ?? null;
            const y = now[f]?.value ?? null;
            if (x !== y) derived.push({ specimen: s, field: f, before: x, after: y });
          }
        }
        const key = (e: ElementTally): string => `${e.taxon}\u0000${e.element}`;
        const old = new Map(before.refitted.byElement.map((e) => [key(e), e]));
        const now = new Map(after.refitted.byElement.map((e) => [key(e), e]));
        const elements: JoinPreview['elements'] = [];
        for (const k of new Set([...old.keys(), ...now.keys()])) {
          const x = pick(old.get(k));
          const y = pick(now.get(k));
          if (JSON.stringify(x) === JSON.stringify(y)) continue;
          const [taxon, element] = k.split('\u0000');
          elements.push({ taxon, element, before: x, after: y });
        }
        return {
          joinId: join.id,
          type: kind,
          conflicts: [],
          derived,
          elements,
          nisp: { before: before.refitted.nisp, after: after.refitted.nisp },
          identifiedToElement: { before: before.refitted.identifiedToElement, after: after.refitted.identifiedToElement },
        };
      }),
  }),
};
