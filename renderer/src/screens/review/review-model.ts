/** Joins as the review screen reads them from the host, and the words it shows. */
export interface JoinView {
  id: number;
  a: string;
  b: string;
  status: 'proposed' | 'accepted' | 'rejected';
  type: string | null;
  score: number | null;
  transform: number[] | null;
  decidedBy: string | null;
  decidedAt: string | null;
}

export interface Conflict {
  field: string;
  reason: string;
}

/** What accepting a proposal would change (host request `joins.preview`). */
export interface JoinPreview {
  conflicts: Conflict[];
  derived: Array<{ specimen: string; field: 'taxon' | 'element' | 'side'; before: string | null; after: string | null }>;
  elements: Array<{
    taxon: string;
    element: string;
    before: { nisp: number; mneLeft: number; mneRight: number; mne: number } | null;
    after: { nisp: number; mneLeft: number; mneRight: number; mne: number } | null;
  }>;
  nisp: { before: number; after: number };
  identifiedToElement: { before: number; after: number };
}

export const JOIN_TYPE_CHOICES = [
  { type: 'conjoin-green', label: 'Conjoin, green break', key: '1' },
  { type: 'conjoin-dry', label: 'Conjoin, dry break', key: '2' },
  { type: 'conjoin-modern', label: 'Conjoin, modern break', key: '3' },
  { type: 'articulation', label: 'Articulation', key: '4' },
  { type: 'pair', label: 'Pair (left and right)', key: '5' },
] as const;

export type JoinTypeChoice = (typeof JOIN_TYPE_CHOICES)[number]['type'];

/** Proposals to review, best score first. */
export function queueOrder(joins: JoinView[]): JoinView[] {
  return joins.filter((j) => j.status === 'proposed').sort((x, y) => (y.score ?? -1) - (x.score ?? -1) || x.id - y.id);
}

/**
 * Sentences for the analyst: "KB-12 becomes Cervus elaphus, femur, left" per specimen, then
 * "MNE of Cervus elaphus femur, left: 3 -> 2" per changed element count.
 */
export function previewSentences(p: JoinPreview): string[] {
  const out: string[] = [];
  const bySpecimen = new Map<string, Partial<Record<'taxon' | 'element' | 'side', string | null>>>();
  for (const d of p.derived) {
    if (d.before === d.after) continue;
    const m = bySpecimen.get(d.specimen) ?? {};
    m[d.field] = d.after;
    bySpecimen.set(d.specimen, m);
  }
  for (const [specimen, m] of bySpecimen) {
    const parts = [m.taxon, m.element, m.side].filter((x): x is string => !!x);
    if (parts.length) out.push(`${specimen} becomes ${parts.join(', ')}`);
  }
  for (const e of p.elements) {
    const b = e.before;
    const a = e.after;
    const name = `${e.taxon} ${e.element}`;
    if ((b?.mneLeft ?? 0) !== (a?.mneLeft ?? 0)) out.push(`MNE of ${name}, left: ${b?.mneLeft ?? 0} → ${a?.mneLeft ?? 0}`);
    if ((b?.mneRight ?? 0) !== (a?.mneRight ?? 0)) out.push(`MNE of ${name}, right: ${b?.mneRight ?? 0} → ${a?.mneRight ?? 0}`);
    if ((b?.mne ?? 0) !== (a?.mne ?? 0)) out.push(`MNE of ${name}: ${b?.mne ?? 0} → ${a?.mne ?? 0}`);
    if ((b?.nisp ?? 0) !== (a?.nisp ?? 0)) out.push(`NISP of ${name}: ${b?.nisp ?? 0} → ${a?.nisp ?? 0}`);
  }
  if (p.nisp.before !== p.nisp.after) out.push(`NISP: ${p.nisp.before} → ${p.nisp.after}`);
  return out;
}
