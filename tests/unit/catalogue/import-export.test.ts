import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openCatalogue, type Catalogue } from '../../../core/catalogue/catalogue';
import { exportCatalogue, specimensCsv } from '../../../core/catalogue/export';
import { SUGGESTION_BUDGET, detectDelimiter, importSpecimens } from '../../../core/catalogue/import-specimens';
import { KnitboneError } from '../../../core/host/errors';
import { emptySpecimenFields } from '../../../core/catalogue/records';
import { tempDir } from './helpers';

const fresh = (): Catalogue => openCatalogue(join(tempDir(), 'site.sqlite'), { create: true, who: 'tester' });

const good = [
  'catalogue_no,unit,level,layer,x,y,z,taxon,element,side,portion,fusion,size_class,break_age,modifications,weight_g,notes',
  'HF-001,N4E2,2,B,104.512,208.03,-1.27,Cervus elaphus,femur,left,proximal-shaft;midshaft,,,fresh,cut-mark;weathering-1,23.4,',
  'HF-002,N4E2,2,B,104.61,208.2,-1.3,,long bone,,midshaft,,3,dry,,4.1,"shaft splinter, spiral break"',
  'HF-003,N4E3,3,C,,,,Bos taurus,astragalus,R,,fused,4,,,61,',
].join('\n');

/** The problems of a failed import, as `line N, column C` -> message. */
function problemsOf(cat: Catalogue, csv: string | Uint8Array, update = false): string[] {
  try {
    importSpecimens(cat, csv, { fileName: 'test.csv', update });
  } catch (err) {
    expect(err).toBeInstanceOf(KnitboneError);
    return (err as KnitboneError).problems.map((p) => `line ${p.line}, column ${p.column}: ${p.message}`);
  }
  throw new Error('the import should have failed');
}

describe('specimen CSV import', () => {
  it('imports a good file in canonical terms and records it in history', () => {
    const cat = fresh();
    const r = importSpecimens(cat, good, { fileName: 'good.csv' });
    expect(r).toMatchObject({ rows: 3, inserted: 3, delimiter: ',' });
    expect(cat.specimens.getByCatalogueNo('HF-001')).toMatchObject({
      x: 104.512, z: -1.27, taxon: 'Cervus elaphus', element: 'femur', side: 'left',
      portion: ['proximal-shaft', 'midshaft'], breakAge: 'fresh', modifications: ['cut-mark', 'weathering-1'], weightG: 23.4,
    });
    expect(cat.specimens.getByCatalogueNo('HF-002')).toMatchObject({ sizeClass: 3, notes: 'shaft splinter, spiral break', taxon: null });
    expect(cat.specimens.getByCatalogueNo('HF-003')).toMatchObject({ side: 'right', fusion: 'fused' });
    expect(cat.history.list({ entity: 'specimen' })).toHaveLength(3);
    expect(cat.history.list({ entity: 'import' })[0].after).toMatchObject({ file: 'good.csv', inserted: 3 });
  });

  it('accepts columns in any order, only catalogue_no required, a BOM and semicolons', () => {
    const cat = fresh();
    const text = '\uFEFFElement; Catalogue No ;portion\nfemur;A-1;"PE;PS"\n;A-2;\n';
    expect(detectDelimiter(text.slice(1))).toBe(';');
    const r = importSpecimens(cat, new TextEncoder().encode(text));
    expect(r.delimiter).toBe(';');
    expect(cat.specimens.getByCatalogueNo('A-1')).toMatchObject({ element: 'femur', portion: ['proximal-end', 'proximal-shaft'] });
    expect(cat.specimens.getByCatalogueNo('A-2')).toMatchObject({ element: null, portion: [] });
  });

  it('reports every kind of bad row by line and column, and imports nothing', () => {
    const cat = fresh();
    cat.specimens.insert(emptySpecimenFields('OLD-1'));
    const before = { specimens: cat.specimens.count(), history: cat.history.count() };
    const csv = [
      'catalogue_no,x,taxon,element,side,portion,size_class,weight_g,break_age,modifications', // line 1
      'B-1,12.5,Cervus elaphis,femur,left,,,,,', // 2: unknown taxon
      'B-2,1,,femor,,,,,,', // 3: unknown element
      'B-3,north,,,,,,,,', // 4: non-numeric coordinate
      'B-4,,,femur,west,,,,,', // 5: side not in the vocabulary
      'B-5,,,cranium,,midshaft,,,,', // 6: zone not valid for the element
      'B-1,,,,,,,,,', // 7: duplicate within the file
      'OLD-1,,,,,,,,,', // 8: duplicate against the catalogue
      ',,,,,,,,,x', // 9: no catalogue number (and an unknown modification)
      'B-6,,,,,,9,-2,ancient,', // 10: size class, weight, break age
      'B-7,,,femur,,elbow,,,,', // 11: unknown zone
    ].join('\n');
    const problems = problemsOf(cat, csv);
    const expectProblem = (prefix: string, pattern: RegExp) =>
      expect(problems.find((p) => p.startsWith(prefix)), prefix).toMatch(pattern);
    expectProblem('line 2, column taxon', /unknown taxon "Cervus elaphis"; closest known: "Cervus elaphus"/);
    expectProblem('line 3, column element', /unknown element "femor"; closest known: "femur"/);
    expectProblem('line 4, column x', /"north" is not a number/);
    expectProblem('line 5, column side', /"west" is not a side/);
    expectProblem('line 6, column portion', /apply to long bones, not to "cranium"/);
    expectProblem('line 7, column catalogue_no', /also on line 2/);
    expectProblem('line 8, column catalogue_no', /already in the catalogue/);
    expectProblem('line 9, column catalogue_no', /required/);
    expectProblem('line 9, column modifications', /unknown modification "x"/);
    expectProblem('line 10, column size_class', /not a size class/);
    expectProblem('line 10, column weight_g', /negative/);
    expectProblem('line 10, column break_age', /not a break age/);
    expectProblem('line 11, column portion', /unknown portion zone "elbow"/);
    // All-or-nothing: nothing was added, and no history was written.
    expect(cat.specimens.count()).toBe(before.specimens);
    expect(cat.history.count()).toBe(before.history);
  });

  it('refuses bad headers, broken CSV and text that is not UTF-8', () => {
    const cat = fresh();
    expect(problemsOf(cat, 'unit,taxon\nN1,Bos taurus\n')[0]).toMatch(/no catalogue_no column/);
    expect(problemsOf(cat, 'catalogue_no,taxn\nA,Bos taurus\n')[0]).toMatch(/line 1, column taxn: unknown column "taxn"; closest known: "taxon"/);
    expect(problemsOf(cat, 'catalogue_no,unit,unit\nA,1,2\n')[0]).toMatch(/appears twice/);
    expect(problemsOf(cat, 'catalogue_no,notes\nA,"never closed\n')[0]).toMatch(/not valid CSV/);
    expect(problemsOf(cat, 'catalogue_no,unit\nA,N1,extra\n')[0]).toMatch(/line 2, .*3 cells but the header has 2/);
    expect(problemsOf(cat, new Uint8Array([0x63, 0x61, 0x74, 0xff, 0xfe, 0x0a]))[0]).toMatch(/not UTF-8/);
    expect(cat.specimens.count()).toBe(0);
  });

  it('reports every unknown term of a large bad file, with suggestions for the first ones', () => {
    const cat = fresh();
    const rows = Array.from({ length: SUGGESTION_BUDGET + 50 }, (_, i) => `Q-${i},Cervus elaphis ${i}`);
    const problems = problemsOf(cat, ['catalogue_no,taxon', ...rows].join('\n'));
    expect(problems).toHaveLength(SUGGESTION_BUDGET + 50);
    expect(problems[0]).toMatch(/^line 2, column taxon: .*closest known: .*"Cervus elaphus"/);
    expect(problems.at(-1)).toMatch(new RegExp(`^line ${SUGGESTION_BUDGET + 51}, column taxon: unknown taxon`));
    expect(problems.at(-1)).not.toMatch(/closest known/);
  });

  it('counts lines from the start of a row even after a quoted cell with line breaks', () => {
    const cat = fresh();
    const problems = problemsOf(cat, 'catalogue_no,notes,side\nA,"two\nlines",left\nB,,sideways\n');
    expect(problems).toEqual([expect.stringMatching(/^line 4, column side: "sideways" is not a side/)]);
  });

  it('updates changed rows with --update and records each change in history', () => {
    const cat = fresh();
    importSpecimens(cat, good);
    const edited = good.replace('HF-002,N4E2,2,B,104.61', 'HF-002,N4E9,2,B,104.61').replace(',Bos taurus,astragalus,R,', ',Bison bison,astragalus,R,');
    const r = importSpecimens(cat, edited, { update: true });
    expect(r).toMatchObject({ inserted: 0, updated: 2, unchanged: 1 });
    expect(r.changes).toEqual([{ catalogueNo: 'HF-002', fields: ['unit'] }, { catalogueNo: 'HF-003', fields: ['taxon'] }]);
    const h = cat.history.list({ entity: 'specimen', entityId: cat.specimens.getByCatalogueNo('HF-003')!.id });
    expect(h.at(-1)).toMatchObject({ action: 'import-update', before: { taxon: 'Bos taurus' }, after: { taxon: 'Bison bison' } });
    // Same file again: nothing changes, no new specimen history.
    const count = cat.history.list({ entity: 'specimen' }).length;
    expect(importSpecimens(cat, edited, { update: true })).toMatchObject({ updated: 0, unchanged: 3 });
    expect(cat.history.list({ entity: 'specimen' })).toHaveLength(count);
  });
});

describe('catalogue export', () => {
  it('round-trips specimens.csv exactly through export and import', () => {
    const a = fresh();
    importSpecimens(a, good);
    const dir = tempDir();
    const files = exportCatalogue(a, dir);
    expect(files.map((f) => f.name)).toEqual(['specimens.csv', 'joins.csv', 'history.csv']);
    const exported = readFileSync(join(dir, 'specimens.csv'), 'utf8');
    const b = fresh();
    importSpecimens(b, exported);
    expect(specimensCsv(b)).toBe(exported);
    const strip = (c: Catalogue) => c.specimens.list().map(({ id: _i, createdAt: _c, updatedAt: _u, ...rest }) => rest);
    expect(strip(b)).toEqual(strip(a));
  });

  it('writes joins with both catalogue numbers and the history as CSV', () => {
    const cat = fresh();
    importSpecimens(cat, good);
    const [s1, s2] = cat.specimens.list();
    cat.joins.insert({ specimenA: s1.id, specimenB: s2.id, status: 'accepted', type: 'conjoin', score: 0.91, decidedBy: 'tester' });
    const dir = tempDir();
    exportCatalogue(cat, dir);
    const joins = readFileSync(join(dir, 'joins.csv'), 'utf8').trim().split('\n');
    expect(joins[0].split(',').slice(0, 5)).toEqual(['join_id', 'catalogue_no_a', 'catalogue_no_b', 'status', 'type']);
    expect(joins[1]).toMatch(/^1,HF-001,HF-002,accepted,conjoin,,0\.91,/);
    const history = readFileSync(join(dir, 'history.csv'), 'utf8').trim().split('\n');
    expect(history.length - 1).toBe(cat.history.count());
  });
});
