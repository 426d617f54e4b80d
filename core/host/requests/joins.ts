import { z } from 'zod';
import { withCatalogue, type Catalogue, type Join, type JoinPatch, type Specimen } from '../../catalogue/index';
import type { Conflict } from '../../refits/conflict';
import { JOIN_TYPES, type RefitJoinType } from '../../refits/join-type';
import { KnitboneError } from '../errors';
import { decisionKind, storedKind, writtenKind } from '../counting/join-kind';
import { refitJoinOf, type CatalogueRefits } from '../counting/refits-of';
import { forget, refitsFor, remember } from '../counting/refits-cache';
import { RefitState } from '../../refits/refit-state';
import { syncDerived, type DerivedChanges } from '../counting/sync-derived';
import { defineRequest } from '../request';

const cataloguePath = z.string().trim().min(1, 'give the path of a catalogue file');
const by = z.string().trim().min(1).optional();
const joinId = z.number().int().positive();
const joinType = z.enum(JOIN_TYPES);

/** A join as listed: catalogue numbers, the type as written, the decision. */
export interface JoinView {
  id: number;
  a: string;
  b: string;
  status: Join['status'];
  type: RefitJoinType | null;
  score: number | null;
  transform: number[] | null;
  decidedBy: string | null;
  decidedAt: string | null;
}

export interface Decision {
  join: JoinView & { forced: boolean; note: string | null };
  /** Conflicts the join raised (only when forced). */
  conflicts: Conflict[];
  /** Derived identifications written or removed by this decision. */
  derived: DerivedChanges;
}

function catalogueNoOf(byId: Map<number, Specimen>, id: number): string {
  return byId.get(id)?.catalogueNo ?? String(id);
}

export function joinView(j: Join, byId: Map<number, Specimen>): JoinView {
  return {
    id: j.id,
    a: catalogueNoOf(byId, j.specimenA),
    b: catalogueNoOf(byId, j.specimenB),
    status: j.status,
    type: writtenKind(j),
    score: j.score,
    transform: j.transform,
    decidedBy: j.decidedBy,
    decidedAt: j.decidedAt,
  };
}

function decision(j: Join, refits: CatalogueRefits, conflicts: Conflict[], derived: DerivedChanges): Decision {
  return { join: { ...joinView(j, refits.byId), forced: j.forced, note: j.note }, conflicts, derived };
}

/** Refuse a conflicting join unless forced: one problem per conflict, naming the field. */
function refuseConflicts(conflicts: Conflict[], what: string): void {
  throw new KnitboneError(
    'conflict',
    conflicts.map((c) => ({ field: c.field, message: `${what} conflicts in ${c.field}: ${c.reason}; give --force to accept it anyway (it will not carry ${c.field})` })),
  );
}

/**
 * Run one decision in one transaction on the kept reading of the catalogue. The refit
 * state is changed in memory as the decision goes; if anything fails, the transaction
 * rolls back and the kept reading is dropped.
 */
function decide<T>(cat: Catalogue, fn: (refits: CatalogueRefits) => { result: T; refits: CatalogueRefits }): T {
  let kept: CatalogueRefits | undefined;
  let applied = 0;
  try {
    const { result, refits } = cat.transaction(() => {
      kept = refitsFor(cat);
      applied = kept.state.acceptedJoins().length;
      return fn(kept);
    });
    remember(cat, refits);
    return result;
  } catch (err) {
    // A refusal before anything changed leaves the kept reading valid.
    if (!kept || kept.state.acceptedJoins().length !== applied) forget(cat);
    throw err;
  }
}

/** A moment strictly after every decision already taken, so decision order is kept. */
function decisionTime(refits: CatalogueRefits): string {
  const now = new Date().toISOString();
  const last = refits.lastDecidedAt;
  const at = now > last ? now : new Date(Date.parse(last) + 1).toISOString();
  refits.lastDecidedAt = at;
  return at;
}

/** Requests that record, decide and undo joins, with propagation of identifications. */
export const joinsRequests = {
  'joins.link': defineRequest({
    summary: 'Record a join found by hand between two specimens, as accepted; propagate identifications',
    input: z
      .object({
        catalogue: cataloguePath,
        a: z.string().trim().min(1, 'give the catalogue number of the first specimen'),
        b: z.string().trim().min(1, 'give the catalogue number of the second specimen'),
        type: joinType,
        by,
        note: z.string().optional(),
        force: z.boolean().optional(),
      })
      .strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        decide(cat, (refits) => {
          const a = cat.specimens.require(input.a);
          const b = cat.specimens.require(input.b);
          if (a.id === b.id) throw new KnitboneError('bad-input', [{ field: 'b', message: 'a specimen cannot join itself; give two catalogue numbers' }]);
          const between = cat.joins.list({ specimenId: a.id }).filter((j) => j.specimenA === b.id || j.specimenB === b.id);
          const already = between.find((j) => j.status === 'accepted');
          if (already) throw new KnitboneError('conflict', `${a.catalogueNo} and ${b.catalogueNo} are already joined (join ${already.id})`);
          const proposed = between.find((j) => j.status === 'proposed');
          if (proposed) {
            throw new KnitboneError(
              'conflict',
              `join ${proposed.id} already proposes ${a.catalogueNo} + ${b.catalogueNo}; accept it instead (knitbone accept <catalogue> ${proposed.id} --type ${input.type})`,
            );
          }
          const who = input.by ?? cat.who;
          const conflicts = refits.state.check({ id: 0, a: a.catalogueNo, b: b.catalogueNo, type: input.type });
          if (conflicts.length && !input.force) refuseConflicts(conflicts, `the ${input.type} of ${a.catalogueNo} and ${b.catalogueNo}`);
          const join = cat.joins.insert(
            {
              specimenA: a.id,
              specimenB: b.id,
              status: 'accepted',
              ...storedKind(input.type),
              note: input.note ?? null,
              forced: conflicts.length > 0,
              decidedBy: who,
              decidedAt: decisionTime(refits),
            },
            who,
            'link',
          );
          refits.state.accept(refitJoinOf(join, refits.byId));
          const derived = syncDerived(cat, refits, who, refits.state.linkedMembers(a.catalogueNo));
          return { result: decision(join, refits, conflicts, derived), refits };
        }),
      ),
  }),

  'joins.accept': defineRequest({
    summary: 'Accept a proposed join (optionally setting its type); propagate identifications',
    input: z.object({ catalogue: cataloguePath, id: joinId, type: joinType.optional(), by, force: z.boolean().optional() }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        decide(cat, (refits) => {
          const current = cat.joins.require(input.id);
          if (current.status === 'accepted') throw new KnitboneError('conflict', `join ${input.id} is already accepted`);
          const kind = decisionKind(current, input.type);
          const who = input.by ?? cat.who;
          const a = refits.byId.get(current.specimenA)!.catalogueNo;
          const b = refits.byId.get(current.specimenB)!.catalogueNo;
          const conflicts = refits.state.check({ id: current.id, a, b, type: kind });
          if (conflicts.length && !input.force) refuseConflicts(conflicts, `join ${current.id} (${kind} of ${a} and ${b})`);
          const stored = kind === 'conjoin' ? { type: 'conjoin' as const, breakAge: current.breakAge } : storedKind(kind);
          const join = cat.joins.update(
            current.id,
            { status: 'accepted', ...stored, forced: conflicts.length > 0, decidedBy: who, decidedAt: decisionTime(refits) },
            who,
            'accept',
          );
          refits.state.accept(refitJoinOf(join, refits.byId));
          const derived = syncDerived(cat, refits, who, refits.state.linkedMembers(a));
          return { result: decision(join, refits, conflicts, derived), refits };
        }),
      ),
  }),

  'joins.reject': defineRequest({
    summary: 'Reject a proposed join (nothing propagates through it)',
    input: z.object({ catalogue: cataloguePath, id: joinId, type: joinType.optional(), by }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        decide(cat, (refits) => {
          const current = cat.joins.require(input.id);
          if (current.status === 'accepted') {
            throw new KnitboneError('conflict', `join ${input.id} is accepted; undo it with \`knitbone unlink\` first`);
          }
          if (current.status === 'rejected') throw new KnitboneError('conflict', `join ${input.id} is already rejected`);
          const who = input.by ?? cat.who;
          const join = cat.joins.update(
            current.id,
            { status: 'rejected', ...(input.type ? storedKind(input.type) : {}), decidedBy: who, decidedAt: new Date().toISOString() },
            who,
            'reject',
          );
          return { result: decision(join, refits, [], { set: [], removed: [] }), refits };
        }),
      ),
  }),

  'joins.unlink': defineRequest({
    summary: 'Undo an accepted join: back to what it was before (a hand-made link is removed); counts follow',
    input: z.object({ catalogue: cataloguePath, id: joinId, by }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        decide(cat, (refits) => {
          const current = cat.joins.require(input.id);
          if (current.status !== 'accepted') throw new KnitboneError('conflict', `join ${input.id} is ${current.status}, not accepted; there is nothing to undo`);
          const who = input.by ?? cat.who;
          const made = cat.history
            .list({ entity: 'join', entityId: current.id })
            .filter((h) => h.action === 'accept' || h.action === 'link')
            .pop();
          let join: Join = current;
          let removed = false;
          if (!made || made.action === 'link') {
            cat.joins.remove(current.id, who, 'unlink');
            removed = true;
          } else {
            // The accept entry holds every field the acceptance changed, as it was before.
            const before = (made.before ?? {}) as JoinPatch;
            join = cat.joins.update(
              current.id,
              before,
              who,
              'unlink',
            );
          }
          // Rebuild without this join; only its linked components can change.
          const a = refits.byId.get(current.specimenA)!.catalogueNo;
          const b = refits.byId.get(current.specimenB)!.catalogueNo;
          const affected = [...new Set([...refits.state.linkedMembers(a), ...refits.state.linkedMembers(b)])];
          const state = RefitState.build(
            refits.state.observations,
            refits.state.acceptedJoins().filter((j) => j.id !== current.id),
            refits.vocab,
          );
          const after = { ...refits, state };
          return { result: { ...decision(join, after, [], syncDerived(cat, after, who, affected)), removed }, refits: after };
        }),
      ),
  }),

  'joins.check': defineRequest({
    summary: 'The conflicts a join would raise if accepted now (by join id, or for two catalogue numbers and a type)',
    input: z
      .object({
        catalogue: cataloguePath,
        id: joinId.optional(),
        a: z.string().trim().min(1).optional(),
        b: z.string().trim().min(1).optional(),
        type: joinType.optional(),
      })
      .strict()
      .refine((x) => x.id !== undefined || (x.a !== undefined && x.b !== undefined && x.type !== undefined), {
        message: 'give a join id, or two catalogue numbers and a type',
      }),
    run: (input) =>
      withCatalogue(input.catalogue, (cat): { conflicts: Conflict[] } => {
        const refits = refitsFor(cat);
        if (input.id !== undefined) {
          const j = cat.joins.require(input.id);
          const join = { ...refitJoinOf(j, refits.byId), type: input.type ?? writtenKind(j) ?? 'conjoin' };
          if (j.status === 'accepted') return { conflicts: [...refits.state.conflictsOf(j.id)] };
          return { conflicts: refits.state.check(join) };
        }
        const a = cat.specimens.require(input.a!).catalogueNo;
        const b = cat.specimens.require(input.b!).catalogueNo;
        return { conflicts: refits.state.check({ id: 0, a, b, type: input.type! }) };
      }),
  }),

  'joins.reopen': defineRequest({
    summary: 'Undo the rejection of a join: it returns to what it was before (usually proposed)',
    input: z.object({ catalogue: cataloguePath, id: joinId, by }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) =>
        decide(cat, (refits) => {
          const current = cat.joins.require(input.id);
          if (current.status !== 'rejected') throw new KnitboneError('conflict', `join ${input.id} is ${current.status}, not rejected; there is nothing to reopen`);
          const made = cat.history
            .list({ entity: 'join', entityId: current.id })
            .filter((h) => h.action === 'reject')
            .pop();
          // The reject entry holds every field the rejection changed, as it was before.
          const before = (made?.before ?? { status: 'proposed', decidedBy: null, decidedAt: null }) as JoinPatch;
          const join = cat.joins.update(current.id, before, input.by ?? cat.who, 'reopen');
          return { result: decision(join, refits, [], { set: [], removed: [] }), refits };
        }),
      ),
  }),

  'joins.list': defineRequest({
    summary: 'Joins of a catalogue (optionally of one status), with catalogue numbers',
    input: z.object({ catalogue: cataloguePath, status: z.enum(['proposed', 'accepted', 'rejected']).optional() }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat): JoinView[] => {
        const { byId } = refitsFor(cat);
        return cat.joins.list({ status: input.status }).map((j) => joinView(j, byId));
      }),
  }),

  'joins.conflicts': defineRequest({
    summary: 'Accepted joins that conflict (forced) and proposed joins that would, with reasons',
    input: z.object({ catalogue: cataloguePath }).strict(),
    run: (input) =>
      withCatalogue(input.catalogue, (cat) => {
        const refits = refitsFor(cat);
        const out: Array<JoinView & { conflicts: Conflict[] }> = [];
        for (const j of cat.joins.list()) {
          let conflicts: readonly Conflict[] = [];
          if (j.status === 'accepted') conflicts = refits.state.conflictsOf(j.id);
          else if (j.status === 'proposed') conflicts = refits.state.check(refitJoinOf(j, refits.byId));
          if (conflicts.length) out.push({ ...joinView(j, refits.byId), conflicts: [...conflicts] });
        }
        return out;
      }),
  }),
};
