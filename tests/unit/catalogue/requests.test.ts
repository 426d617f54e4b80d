import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { Host } from '../../../core/host/host';
import { KnitboneError } from '../../../core/host/errors';
import { tempDir } from './helpers';

describe('catalogue host requests', () => {
  it('creates a catalogue, adds a specimen in canonical terms, updates and reads it back', async () => {
    const host = new Host();
    const catalogue = join(tempDir(), 'site.sqlite');
    const init = await host.call('catalogue.init', { catalogue });
    expect(init).toMatchObject({ created: true, specimens: 0 });
    const s = await host.call('specimens.create', {
      catalogue,
      who: 'tester',
      specimen: { catalogueNo: ' KB-7 ', taxon: 'red  deer', element: 'Fem', side: 'L', portion: ['Prox. end', 'PS'], breakAge: 'green', modifications: ['cut', 'W2'] },
    });
    expect(s).toMatchObject({
      catalogueNo: 'KB-7', taxon: 'Cervus elaphus', element: 'femur', side: 'left',
      portion: ['proximal-end', 'proximal-shaft'], breakAge: 'fresh', modifications: ['cut-mark', 'weathering-2'],
    });
    const u = await host.call('specimens.update', { catalogue, catalogueNo: 'KB-7', changes: { side: 'R', weightG: 12.5 } });
    expect(u.changed).toEqual(['side', 'weightG']);
    const got = await host.call('specimens.get', { catalogue, id: s.id });
    expect(got.specimen).toMatchObject({ side: 'right', weightG: 12.5 });
    expect(await host.call('specimens.list', { catalogue, taxon: 'Cervus elaphus' })).toHaveLength(1);
  });

  it('answers bad values with one problem per field and the closest known terms', async () => {
    const host = new Host();
    const catalogue = join(tempDir(), 'site.sqlite');
    await host.call('catalogue.init', { catalogue });
    const err = await host
      .call('specimens.create', { catalogue, specimen: { catalogueNo: 'KB-1', taxon: 'Cervus elaphis', element: 'cranium', side: 'west', portion: ['midshaft'] } })
      .catch((e: unknown) => e as KnitboneError);
    expect(err).toBeInstanceOf(KnitboneError);
    const messages = (err as KnitboneError).problems.map((p) => p.message);
    expect(messages.find((m) => m.startsWith('taxon'))).toMatch(/closest known: "Cervus elaphus"/);
    expect(messages.find((m) => m.startsWith('side'))).toMatch(/not a side/);
    expect(await host.call('specimens.list', { catalogue })).toHaveLength(0);
    // Zones only on long bones.
    const zone = await host
      .call('specimens.create', { catalogue, specimen: { catalogueNo: 'KB-1', element: 'cranium', portion: ['midshaft'] } })
      .catch((e: unknown) => e as KnitboneError);
    expect((zone as KnitboneError).message).toMatch(/apply to long bones/);
  });

  it('lets an analyst add a taxon and an element, then use them by name or synonym', async () => {
    const host = new Host();
    const catalogue = join(tempDir(), 'site.sqlite');
    await host.call('catalogue.init', { catalogue });
    await host.call('vocabulary.add', { catalogue, kind: 'taxon', term: 'Saiga', parent: 'bovid', rank: 'genus' });
    await host.call('vocabulary.add', { catalogue, kind: 'taxon', term: 'Saiga tatarica', parent: 'Saiga', rank: 'species', synonyms: ['saiga antelope'] });
    await host.call('vocabulary.add', { catalogue, kind: 'element', term: 'os penis', parent: 'bone', paired: false, synonyms: ['baculum'] });
    const refused = await host.call('vocabulary.add', { catalogue, kind: 'taxon', term: 'Cervus elaphus', parent: 'Cervidae' }).catch((e: unknown) => e as KnitboneError);
    expect((refused as KnitboneError).message).toMatch(/already means the taxon "Cervus elaphus"/);
    const s = await host.call('specimens.create', { catalogue, specimen: { catalogueNo: 'S-1', taxon: 'Saiga Antelope', element: 'baculum' } });
    expect(s).toMatchObject({ taxon: 'Saiga tatarica', element: 'os penis' });
    const list = await host.call('vocabulary.list', { catalogue });
    expect(list.taxa.find((t) => t.name === 'Saiga tatarica')).toMatchObject({ parent: 'Saiga', added: true });
    const history = await host.call('history.list', { catalogue, entity: 'vocabulary_term' });
    expect(history).toHaveLength(3);
  });
});
