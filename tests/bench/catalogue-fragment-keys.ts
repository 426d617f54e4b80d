/**
 * The match-cache key of each scanned specimen of a catalogue, by catalogue number (the
 * catalogue is only read), for bench studies that read a propose run's match cache.
 */
import { openCatalogue } from '../../core/catalogue/catalogue';
import { fragmentKey } from '../../core/jobs/fragment-cache';

export function catalogueFragmentKeys(catalogue: string): Map<string, string> {
  const keyOf = new Map<string, string>();
  const cat = openCatalogue(catalogue);
  try {
    const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
    for (const s of cat.scans.list()) keyOf.set(numbers.get(s.specimenId) ?? '', fragmentKey(s.contentHash, s.units, (s.stats as { settings?: unknown }).settings, []));
  } finally {
    cat.close();
  }
  return keyOf;
}
