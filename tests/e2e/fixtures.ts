import { join } from 'node:path';
import { Host } from '../../core/host/host';
import { tempDir } from './harness';

type Loose = (name: string, input: unknown) => Promise<unknown>;

/** A new catalogue in a temporary folder, made through the host API as the app would. */
export async function newCatalogue(specimens: Array<Record<string, unknown>> = []): Promise<{ path: string; call: Loose }> {
  const path = join(tempDir('catalogue'), 'assemblage.sqlite');
  const host = new Host();
  const call = host.callUnchecked.bind(host) as Loose;
  await call('catalogue.init', { catalogue: path });
  for (const s of specimens) await call('specimens.create', { catalogue: path, specimen: s });
  return { path, call };
}

/** Through the first screen into a catalogue the session already names. */
export async function openFromFirstRun(page: import('playwright-core').Page): Promise<void> {
  await page.getByRole('button', { name: 'Open catalogue' }).click();
  await page.getByRole('heading', { name: 'Catalogue', level: 1 }).waitFor();
}
