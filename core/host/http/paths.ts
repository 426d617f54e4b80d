import { join, resolve } from 'node:path';

/** The repository (or installed package) root, from this file's place in core/host/http/. */
export const packageRoot = resolve(import.meta.dirname, '../../..');

/** Where the built renderer lives. */
export const rendererDist = join(packageRoot, 'renderer', 'dist');

/** The committed sample assemblage the demo catalogue is built from. */
export const demoSampleDir = join(packageRoot, 'demo-data', 'sample');

/** The demo catalogue built from the sample on first start (kept out of version control). */
export const demoCatalogue = join(packageRoot, '.cache', 'demo', 'demo.sqlite');
