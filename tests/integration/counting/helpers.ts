import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { emptySpecimenFields, openCatalogue, type SpecimenFields } from '../../../core/catalogue/index';

/** A fresh catalogue file in a temporary folder, filled with the given specimens. */
export function catalogueWith(specimens: Array<Partial<SpecimenFields> & { catalogueNo: string }>): { path: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'knitbone-counting-'));
  const path = join(dir, 'test.sqlite');
  const cat = openCatalogue(path, { create: true, who: 'tester' });
  try {
    cat.specimens.insertMany(specimens.map((s) => ({ ...emptySpecimenFields(s.catalogueNo), ...s })));
  } finally {
    cat.close();
  }
  return { path, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Insert a proposed join between two specimens, as the geometry would. */
export function propose(path: string, a: string, b: string, extra: { score?: number; type?: 'conjoin' | 'articulation' | 'pair'; breakAge?: 'fresh' | 'dry' | 'modern' } = {}): number {
  const cat = openCatalogue(path, { who: 'geometry' });
  try {
    const j = cat.joins.insert({
      specimenA: cat.specimens.require(a).id,
      specimenB: cat.specimens.require(b).id,
      status: 'proposed',
      type: extra.type ?? 'conjoin',
      breakAge: extra.breakAge ?? null,
      score: extra.score ?? 0.9,
      transform: [1, 0, 0, 5, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1],
    });
    return j.id;
  } finally {
    cat.close();
  }
}

/** Rows of the derived identification table and the number of history entries. */
export function readBack(path: string) {
  const cat = openCatalogue(path, { readonly: true });
  try {
    return {
      derived: cat.derived.list().map((d) => ({ specimenId: d.specimenId, field: d.field, value: d.value, joins: d.sourceJoinIds })),
      specimens: cat.specimens.list().map(({ createdAt: _c, updatedAt: _u, ...s }) => s),
      joins: cat.joins.list(),
      history: cat.history.list(),
    };
  } finally {
    cat.close();
  }
}
