import type { BreakAge, Join, JoinType as StoredJoinType } from '../../catalogue/index';
import { KnitboneError } from '../errors';
import type { JoinType, RefitJoinType } from '../../refits/join-type';

/**
 * The join type as people write it (conjoin-green, conjoin-dry, conjoin-modern,
 * articulation, pair) and as the catalogue stores it (type + break age of the conjoin).
 * A green break is stored with the break age "fresh" (Villa & Mahieu 1991 use both words).
 */
export function storedKind(type: JoinType): { type: StoredJoinType; breakAge: BreakAge | null } {
  switch (type) {
    case 'conjoin-green':
      return { type: 'conjoin', breakAge: 'fresh' };
    case 'conjoin-dry':
      return { type: 'conjoin', breakAge: 'dry' };
    case 'conjoin-modern':
      return { type: 'conjoin', breakAge: 'modern' };
    default:
      return { type, breakAge: null };
  }
}

/** The written type of a stored join; a conjoin without a known break age is "conjoin"; null when untyped. */
export function writtenKind(join: Pick<Join, 'type' | 'breakAge'>): RefitJoinType | null {
  if (join.type === null) return null;
  if (join.type !== 'conjoin') return join.type;
  if (join.breakAge === 'fresh') return 'conjoin-green';
  if (join.breakAge === 'dry') return 'conjoin-dry';
  if (join.breakAge === 'modern') return 'conjoin-modern';
  return 'conjoin';
}

/** The type to decide a join with: the one given, else the one it has; refuse when neither. */
export function decisionKind(join: Join, given: JoinType | undefined): RefitJoinType {
  if (given) return given;
  const kind = writtenKind(join);
  if (!kind) {
    throw new KnitboneError('bad-input', [
      { field: 'type', message: `join ${join.id} has no type yet; give one with --type (conjoin-green, conjoin-dry, conjoin-modern, articulation, pair)` },
    ]);
  }
  return kind;
}
