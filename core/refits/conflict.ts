/**
 * A join whose members' observations cannot agree is a conflict: the two pieces cannot be
 * one bone (or one individual) as the join type asserts. Each conflict names the field and
 * says why, in the analyst's words, so the review screen can warn before a decision.
 */
export type ConflictField = 'taxon' | 'element' | 'side' | 'size' | 'zones' | 'specimen';

export interface Conflict {
  field: ConflictField;
  reason: string;
}

export function describeConflicts(conflicts: readonly Conflict[]): string {
  return conflicts.map((c) => `${c.field}: ${c.reason}`).join('; ');
}
