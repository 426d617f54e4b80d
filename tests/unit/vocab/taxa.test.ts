import { describe, expect, it } from 'vitest';
import {
  BUILT_IN_TAXA, TAXON_RANKS, builtInVocabulary as v, buildVocabulary, checkUserTerm, isIdentifiedToRank,
  isTaxonAncestorOrSelf, mostSpecificTaxon, skeletonGroupOf, taxaCompatible, taxonRank,
} from '../../../core/vocab';

// Placement of taxa: Wilson & Reeder 2005, Mammal Species of the World, 3rd ed. (from memory).
describe('taxa hierarchy', () => {
  it('places species under their genus, family and order', () => {
    expect(v.taxa.lineage('Cervus elaphus')).toEqual(['Cervus elaphus', 'Cervus', 'Cervidae', 'Artiodactyla', 'Mammalia', 'Vertebrata']);
    expect(v.taxa.lineage('Ovis aries')).toEqual(['Ovis aries', 'Ovis', 'Caprini', 'Caprinae', 'Bovidae', 'Artiodactyla', 'Mammalia', 'Vertebrata']);
    expect(v.taxa.lineage('Equus caballus').slice(0, 4)).toEqual(['Equus caballus', 'Equus', 'Equidae', 'Perissodactyla']);
    expect(v.taxa.lineage('Vulpes vulpes').slice(0, 4)).toEqual(['Vulpes vulpes', 'Vulpes', 'Canidae', 'Carnivora']);
    expect(v.taxa.lineage('Lepus europaeus').slice(0, 4)).toEqual(['Lepus europaeus', 'Lepus', 'Leporidae', 'Lagomorpha']);
  });

  it('answers ancestry, compatibility and the most specific consistent taxon', () => {
    expect(isTaxonAncestorOrSelf('Cervidae', 'Cervus elaphus')).toBe(true);
    expect(isTaxonAncestorOrSelf('Cervus elaphus', 'Cervidae')).toBe(false);
    expect(isTaxonAncestorOrSelf('Bos taurus', 'Bos taurus')).toBe(true);
    expect(taxaCompatible('Cervidae', 'Cervus elaphus')).toBe(true);
    expect(taxaCompatible('Cervus elaphus', 'Bos taurus')).toBe(false);
    expect(taxaCompatible(null, 'Bos taurus')).toBe(true);
    expect(mostSpecificTaxon([null, 'Mammalia', 'Cervidae', 'Cervus elaphus', 'Cervus'])).toBe('Cervus elaphus');
    expect(mostSpecificTaxon(['Cervidae', 'Bovidae'])).toBeUndefined();
    expect(mostSpecificTaxon([null, null])).toBeNull();
    expect(v.taxa.lowestCommonAncestor('Cervus elaphus', 'Bos taurus')).toBe('Artiodactyla');
    expect(v.taxa.lowestCommonAncestor('Ovis aries', 'Capra hircus')).toBe('Caprini');
    expect(v.taxa.lowestCommonAncestor('Equus caballus', 'Canis lupus')).toBe('Mammalia');
  });

  it('gives ranks, and every rank lies below its parent rank', () => {
    expect(taxonRank('Cervidae')).toBe('family');
    expect(taxonRank('Cervus elaphus')).toBe('species');
    expect(isIdentifiedToRank('Cervus elaphus', 'genus')).toBe(true);
    expect(isIdentifiedToRank('Cervidae', 'genus')).toBe(false);
    for (const t of BUILT_IN_TAXA) {
      if (t.parent === null) continue;
      const parentRank = v.taxa.get(t.parent)!.rank;
      expect(TAXON_RANKS.indexOf(t.rank), `${t.name} below ${t.parent}`).toBeGreaterThan(TAXON_RANKS.indexOf(parentRank));
    }
    // A species name is its genus followed by one epithet (binomial nomenclature).
    for (const t of BUILT_IN_TAXA.filter((x) => x.rank === 'species')) {
      expect(t.name.split(' ')[0], t.name).toBe(t.parent);
    }
  });

  it('covers the groups the catalogue needs, each with its skeleton group', () => {
    expect(skeletonGroupOf('Cervus elaphus')).toBe('cervid');
    expect(skeletonGroupOf('Bison bison')).toBe('bovid');
    expect(skeletonGroupOf('Caprini')).toBe('bovid');
    expect(skeletonGroupOf('Sus scrofa')).toBe('suid');
    expect(skeletonGroupOf('Equus ferus')).toBe('equid');
    expect(skeletonGroupOf('Ursus arctos')).toBe('carnivore');
    expect(skeletonGroupOf('Oryctolagus cuniculus')).toBe('lagomorph');
    expect(skeletonGroupOf('Mammalia')).toBeUndefined();
  });

  it('reads common names, abbreviations, case and spacing as the canonical taxon', () => {
    expect(v.taxa.resolve('  RED   deer ')).toBe('Cervus elaphus');
    expect(v.taxa.resolve('cervus_elaphus')).toBe('Cervus elaphus');
    expect(v.taxa.resolve('Ovis/Capra')).toBe('Caprini');
    expect(v.taxa.resolve('sheep/goat')).toBe('Caprini');
    expect(v.taxa.resolve('cattle')).toBe('Bos taurus');
    expect(v.taxa.resolve('BOVIDAE')).toBe('Bovidae');
    expect(v.taxa.resolve('unicorn')).toBeUndefined();
    expect(v.taxa.suggest('Cervus elaphis')[0]).toBe('Cervus elaphus');
    expect(v.taxa.suggest('red dear')[0]).toBe('Cervus elaphus');
  });

  it('takes taxa an analyst adds, under a known parent', () => {
    const added = buildVocabulary([
      { kind: 'taxon', term: 'Saiga', parent: 'Bovidae', details: { rank: 'genus' } },
      { kind: 'taxon', term: 'Saiga tatarica', parent: 'Saiga', details: { rank: 'species', synonyms: ['saiga antelope'], sizeClass: 2 } },
    ]);
    expect(added.taxa.resolve('saiga antelope')).toBe('Saiga tatarica');
    expect(isTaxonAncestorOrSelf('Bovidae', 'Saiga tatarica', added)).toBe(true);
    expect(skeletonGroupOf('Saiga tatarica', added)).toBe('bovid');
    expect(checkUserTerm(v, { kind: 'taxon', term: 'Saiga', parent: 'Bovidea', details: {} })[0]).toMatch(/did you mean "Bovidae"/);
    expect(checkUserTerm(v, { kind: 'taxon', term: 'red deer', parent: 'Cervidae', details: {} })[0]).toMatch(/already means the taxon "Cervus elaphus"/);
  });
});
