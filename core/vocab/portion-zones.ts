import { termKey } from './normalise';

/**
 * Portion zones of a long bone, from the proximal articular end to the distal one.
 *
 * Recording convention (Dobney & Rielly 1988, "A method for recording archaeological
 * animal bones: the use of diagnostic zones", Circaea 5(2): 79-96): a specimen is recorded
 * as covering a zone when more than half of that zone is present. Dobney & Rielly number
 * zones per element; knitbone uses the five long-bone zones common to every limb bone so
 * that shaft fragments of unknown element can be recorded and overlapped too (MNE from
 * overlapping fragments: Marean et al. 2001).
 */
export const PORTION_ZONES = ['proximal-end', 'proximal-shaft', 'midshaft', 'distal-shaft', 'distal-end'] as const;
export type PortionZone = (typeof PORTION_ZONES)[number];

/** Fraction of a zone that must be present for the specimen to cover it (Dobney & Rielly 1988). */
export const ZONE_PRESENCE_THRESHOLD = 0.5;

const spellings: Record<PortionZone, string[]> = {
  'proximal-end': ['pe', 'px', 'prox', 'proximal', 'prox end', 'proximal epiphysis', 'prox epiphysis', 'pep'],
  'proximal-shaft': ['ps', 'prox shaft', 'proximal diaphysis', 'psh'],
  midshaft: ['ms', 'mid shaft', 'mid', 'middle shaft', 'mid diaphysis', 'msh'],
  'distal-shaft': ['ds', 'dist shaft', 'distal diaphysis', 'dsh'],
  'distal-end': ['de', 'dx', 'dist', 'distal', 'dist end', 'distal epiphysis', 'dist epiphysis', 'dep'],
};

const byKey = new Map<string, PortionZone>();
for (const z of PORTION_ZONES) {
  byKey.set(termKey(z), z);
  for (const s of spellings[z]) byKey.set(termKey(s), z);
}

/** "Prox. end", "PS", "mid shaft" -> canonical zone; undefined when unknown. */
export function resolveZone(text: string): PortionZone | undefined {
  return byKey.get(termKey(text));
}

/**
 * The zones a specimen covers, from the fraction of each zone present (0-1): those with
 * more than half present (Dobney & Rielly 1988). Zones not given count as absent.
 */
export function zonesCovered(fractionPresent: Partial<Record<PortionZone, number>>): PortionZone[] {
  return PORTION_ZONES.filter((z) => (fractionPresent[z] ?? 0) > ZONE_PRESENCE_THRESHOLD);
}

/** Words that mean every zone: a complete long bone. */
export function meansComplete(text: string): boolean {
  return ['complete', 'whole', 'all', 'entire'].includes(termKey(text));
}

/** Zones sorted proximal to distal, each once. */
export function sortZones(zones: Iterable<PortionZone>): PortionZone[] {
  const set = new Set(zones);
  return PORTION_ZONES.filter((z) => set.has(z));
}

export function zoneSpellings(): [string, string][] {
  return [...byKey.entries()];
}
