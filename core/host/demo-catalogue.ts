import { existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { KnitboneError, formatProblem } from './errors';
import { Host } from './host';

type LooseCall = (name: string, input: unknown) => Promise<unknown>;

/**
 * The demo catalogue, built on first use from the committed sample (demo-data/sample/)
 * through the host API, as an analyst would: create, import the specimen list, the site's
 * units, spits and layer tops, and the scans. Returns its path, or null (after saying why) when it cannot be built here.
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
  try {
    await call('catalogue.init', { catalogue: target });
    await call('specimens.import', { catalogue: target, file: csv });
  } catch (err) {
    say('the demo catalogue could not be built from the sample:');
    for (const line of problemLines(err)) say(`  ${line}`);
    for (const suffix of ['', '-wal', '-shm']) rmSync(target + suffix, { force: true });
    return null;
  }
  const site = join(sampleDir, 'site.json');
  if (Host.has('spatial.definitions.import') && existsSync(site)) {
    try {
      await call('spatial.definitions.import', { catalogue: target, file: site });
    } catch (err) {
      say('the demo site definitions could not be read (the specimens are in):');
      for (const line of problemLines(err)) say(`  ${line}`);
    }
  }
  const scans = join(sampleDir, 'scans');
  if (Host.has('scans.import') && existsSync(scans) && readdirSync(scans).length > 0) {
    try {
      await call('scans.import', { catalogue: target, folder: scans, skipBad: true });
    } catch (err) {
      say('the demo scans could not be linked (the specimens are in):');
      for (const line of problemLines(err)) say(`  ${line}`);
    }
  }
  return target;
}

function problemLines(err: unknown): string[] {
  if (err instanceof KnitboneError) return err.problems.slice(0, 10).map(formatProblem);
  return [err instanceof Error ? err.message : String(err)];
}
