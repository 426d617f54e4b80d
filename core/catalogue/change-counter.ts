import type { Catalogue } from './catalogue';

/**
 * The catalogue's change counter (migration 0010): goes up with every insert, update or
 * delete of specimens, joins, user-added vocabulary terms and settings, by any program.
 */
export function changeCount(cat: Catalogue): number {
  return (cat.db.prepare('SELECT n FROM change_counter WHERE id = 1').get() as { n: number }).n;
}
