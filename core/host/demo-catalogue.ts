import { existsSync, mkdirSync, readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { Host } from './host';

type LooseCall = (name: string, input: unknown) => Promise<unknown>;

/**
 * The demo catalogue, built on first use from the committed sample (demo-data/sample/)
 * through the host API, as an analyst would: create, import the specimen list, import the
 * scans. Returns its path, or null (after saying why) when it cannot be built here.
 */
export async function ensureDemoCatalogue(sampleDir: string, target: string, say: (line: string) => void): Promise<string | null> {
  if (existsSync(target)) return target;
  const csv = join(sampleDir, 'specimens.csv');
  if (!existsSync(csv)) {
    say('no demo sample in demo-data/sample/ yet; open or create a catalogue from the first screen');
    return null;
  }
  for (const name of ['catalogue.init', 'specimens.import']) {
    if (!Host.has(name)) {
      say(`this knitbone cannot build the demo catalogue yet (no "${name}" request)`);
      return null;
    }
  }
  const host = new Host();
  const call = host.callUnchecked.bind(host) as LooseCall;
  say('building the demo catalogue from demo-data/sample/ ...');
  mkdirSync(dirname(target), { recursive: true });
  await call('catalogue.init', { catalogue: target });
  await call('specimens.import', { catalogue: target, file: csv });
  const scans = join(sampleDir, 'scans');
  if (Host.has('import.scans') && existsSync(scans) && readdirSync(scans).length > 0) {
    await call('import.scans', { catalogue: target, folder: scans });
  }
  return target;
}
