import { useEffect, useState } from 'react';
import { callByName } from '../../api/loose';
import { useWorkspace } from '../../app/workspace';
import type { FieldName } from './specimen-view';

type Terms = Partial<Record<FieldName, string[]>>;

/**
 * Type-ahead lists for the entry strip from the catalogue's vocabularies (built-in terms
 * plus the ones added to this catalogue), when the host offers them.
 */
export function useVocabulary(): Terms {
  const ws = useWorkspace();
  const [terms, setTerms] = useState<Terms>({});
  const name = ['vocabulary.list', 'vocabulary.terms', 'vocab.list'].find((n) => ws.has(n));
  useEffect(() => {
    if (!name) return;
    callByName<Record<string, unknown>>(ws.client, name, { catalogue: ws.catalogue })
      .then((v) => setTerms(termsFrom(v)))
      .catch(() => setTerms({}));
  }, [ws.client, ws.catalogue, name]);
  return terms;
}

/** Accepts `{taxa: [...], elements: [...], sides: [...]}` with strings or `{term}` objects. */
function termsFrom(v: Record<string, unknown>): Terms {
  const pick = (...keys: string[]): string[] | undefined => {
    for (const k of keys) {
      const list = v[k];
      if (Array.isArray(list)) return list.map((x) => (typeof x === 'string' ? x : String((x as { term?: string; name?: string }).term ?? (x as { name?: string }).name ?? ''))).filter(Boolean);
    }
    return undefined;
  };
  const out: Terms = {};
  const taxa = pick('taxa', 'taxon');
  const elements = pick('elements', 'element');
  const sides = pick('sides', 'side');
  const breaks = pick('breakAges', 'breakAge');
  const zones = pick('portionZones', 'zones', 'portion');
  if (taxa) out.taxon = taxa;
  if (elements) out.element = elements;
  if (sides) out.side = sides;
  if (breaks) out.breakAge = breaks;
  if (zones) out.portion = zones;
  return out;
}
